import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { assertOwnScenario, listRuns, startRun } from "@/lib/runs/service";
import { listRunsQuerySchema } from "@/lib/runs/schema";
import { parseStartRunBody } from "@/lib/runs/http";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Runs of one scenario, newest first: ?page=&pageSize=&status=&sort=newest|oldest */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:read");
  const scenarioId = parseId((await ctx.params).id, "Scenario not found.");
  const query = parseQuery(req, listRunsQuerySchema);
  return cachedRead(req, user, () => listRuns(user, scenarioId, query));
});

/**
 * Starts a run off the request thread; answers 202 with `{ run }` (the queued run) and its Location
 * (503 + Retry-After when the queue is full).
 */
export const POST = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:start");
  const scenarioId = parseId((await ctx.params).id, "Scenario not found.");
  await assertOwnScenario(user, scenarioId);
  const body = await parseStartRunBody(req);
  const run = await startRun(user, scenarioId, body);
  return NextResponse.json({ run }, { status: 202, headers: { Location: run.links.self } });
});
