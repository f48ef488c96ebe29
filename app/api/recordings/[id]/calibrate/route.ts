import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { startCalibration } from "@/lib/calibration/service";

export const runtime = "nodejs";

/**
 * Starts fitting E·A and damping (optionally guide friction) to the recording: { scenarioId, fitFriction? }.
 * Answers 202 with the queued job at once (follow GET …/calibration/events?calibrationId=); 503 + Retry-After when
 * the job queue is full. Saves nothing to the lift.
 */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("run:start");
  const id = parseId((await ctx.params).id, "Recording not found.");
  const calibration = await startCalibration(actor, id, await parseJsonBody(req));
  return NextResponse.json(
    { calibration },
    { status: 202, headers: { Location: `/api/recordings/${id}/calibration?calibrationId=${calibration.id}` } },
  );
});
