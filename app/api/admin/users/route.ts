import { NextResponse } from "next/server";
import { appBaseUrl, inviteUser, listUsers } from "@/lib/auth/accounts";
import { inviteUserSchema } from "@/lib/auth/schemas";
import { requirePermission } from "@/lib/auth/session";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

export const GET = route(async () => {
  const admin = await requirePermission("users:manage");
  return NextResponse.json({ users: await listUsers(admin) });
});

/** Invites a person by e-mail with a role; they choose their password through the one-time link. */
export const POST = route(async (req) => {
  const admin = await requirePermission("users:manage");
  const input = await parseJsonBody(req, inviteUserSchema);
  const user = await inviteUser(admin, input, appBaseUrl(req));
  return NextResponse.json({ user }, { status: 201 });
});
