import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { requirePermission } from "@/lib/auth/session";
import { deleteRun, getRun } from "@/lib/runs/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Status, progress, summary and the stored inputs of one run (its progress as it runs: /events). */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:read");
  const id = parseId((await ctx.params).id, "Run not found.");
  return cachedRead(req, user, () => getRun(user, id));
});

/** Deletes a run: DELETE /api/runs/{id}?version={the version you loaded} (409 when stale). */
export const DELETE = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:delete");
  const version = new URL(req.url).searchParams.get("version");
  await deleteRun(user, parseId((await ctx.params).id, "Run not found."), version);
  return new NextResponse(null, { status: 204 });
});
