import { NextResponse } from "next/server";
import { resetPassword } from "@/lib/auth/accounts";
import { resetPasswordSchema } from "@/lib/auth/schemas";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

export const POST = route(async (req) => {
  const input = await parseJsonBody(req, resetPasswordSchema);
  const { email } = await resetPassword(input);
  return NextResponse.json({ message: "Your password was changed. Sign in with the new one.", email });
});
