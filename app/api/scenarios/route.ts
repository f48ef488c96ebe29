import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { createScenario, listScenarios } from "@/lib/scenarios/service";

export const runtime = "nodejs";

/** Scenarios: ?page&pageSize&sort=name|createdAt|updatedAt|entrySpeed&order&q&liftId&trainId&loading&frozen&archived. */
export const GET = route(async (req) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listScenarios(actor, parseQuery(req)));
});

/** A scenario pinned to the lift's current revision (or the given liftRevisionId). */
export const POST = route(async (req) => {
  const actor = await requirePermission("design:write");
  return NextResponse.json(await createScenario(actor, await parseJsonBody(req)), { status: 201 });
});
