import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { createSession, listSessions } from "@/lib/training/service";

export const runtime = "nodejs";

/** Trainers see every session of the organisation; everyone else the shared ones. */
export const GET = route(async () => {
  const actor = await requirePermission("training:watch");
  return NextResponse.json({ sessions: await listSessions(actor) });
});

export const POST = route(async (req) => {
  const actor = await requirePermission("training:manage");
  return NextResponse.json(await createSession(actor, await parseJsonBody(req)), { status: 201 });
});
