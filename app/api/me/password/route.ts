import { NextResponse } from "next/server";
import { changeOwnPassword } from "@/lib/auth/accounts";
import { changePasswordSchema } from "@/lib/auth/schemas";
import { requirePermission } from "@/lib/auth/session";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

/** Changes the caller's password; all of their sessions end, so the client signs in again. */
export const POST = route(async (req) => {
  const me = await requirePermission("profile:self");
  const input = await parseJsonBody(req, changePasswordSchema);
  await changeOwnPassword(me, input);
  return NextResponse.json({ message: "Password changed. Sign in again with the new password." });
});
