import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { readObjectBody } from "@/lib/api/body";
import { parseId } from "@/lib/api/ids";
import type { RouteContext } from "@/lib/api/params";
import { calibrateRecording } from "@/lib/recordings/service";

export const runtime = "nodejs";

/** Fits E·A and damping (optionally guide friction) to the recording: { scenarioId, fitFriction? }. Saves nothing. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("run:start");
  const id = parseId((await ctx.params).id, "Recording not found.");
  return NextResponse.json(await calibrateRecording(actor, id, await readObjectBody(req)));
});
