import { NextResponse } from "next/server";
import { acceptInvite } from "@/lib/auth/accounts";
import { acceptInviteSchema } from "@/lib/auth/schemas";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

export const POST = route(async (req) => {
  const input = await parseJsonBody(req, acceptInviteSchema);
  const { email } = await acceptInvite(input);
  return NextResponse.json({ message: "Your account is ready. Sign in with your new password.", email });
});
