import { NextResponse } from "next/server";
import { updateOwnProfile } from "@/lib/auth/accounts";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { profileSchema } from "@/lib/auth/schemas";
import { requirePermission } from "@/lib/auth/session";
import { parseJsonBody } from "@/lib/http/request";
import { route } from "@/lib/http/route";

export const runtime = "nodejs";

export const GET = route(async () => {
  const me = await requirePermission("profile:self");
  return NextResponse.json({ ...me, roleLabel: ROLE_LABELS[me.role] });
});

export const PATCH = route(async (req) => {
  const me = await requirePermission("profile:self");
  const input = await parseJsonBody(req, profileSchema);
  return NextResponse.json(await updateOwnProfile(me, input));
});
