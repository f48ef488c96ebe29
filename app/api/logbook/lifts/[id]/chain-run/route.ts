import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { runWithTodaysChain } from "@/lib/logbook/chain-run";

export const runtime = "nodejs";

/**
 * "Run with today's chain": `{ scenarioId }` of this lift → a copy of it with chain.elongation from the newest
 * elongation reading (made once per reading) and its run. Answers 202 with `{ reading, scenario, run, created }`.
 */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:write");
  const id = parseId((await ctx.params).id, "Lift not found.");
  const result = await runWithTodaysChain(actor, id, await parseJsonBody(req));
  return NextResponse.json(result, { status: result.created ? 202 : 200 });
});
