import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { exportScenario } from "@/lib/scenarios/service";

export const runtime = "nodejs";

/** The scenario as a `tautline-scenario/2` file (SI units), offered as a download. */
export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  const { fileName, scenario } = await exportScenario(actor, parseId((await ctx.params).id, "Scenario not found."));
  return new NextResponse(`${JSON.stringify(scenario, null, 2)}\n`, {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="${fileName}"`,
    },
  });
});
