import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { anyJson, parseJsonBody } from "@/lib/http/request";
import { importScenario } from "@/lib/scenarios/import";

export const runtime = "nodejs";

/**
 * Imports a `tautline-scenario/2` file, or a version 1 file converted on read (the body): 400 lists every problem at once; otherwise a lift
 * (revision 1), a train and the scenario are created together.
 */
export const POST = route(async (req) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await importScenario(actor, await parseJsonBody(req, anyJson)), { status: 201 });
});
