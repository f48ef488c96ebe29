import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { getCalibration, latestCalibration } from "@/lib/calibration/service";
import { saveCalibration } from "@/lib/recordings/service";

export const runtime = "nodejs";

/** A calibration job of the recording (?calibrationId=), or its latest (null when none): status, progress, fit. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:read");
  const id = parseId((await ctx.params).id, "Recording not found.");
  const which = parseQuery(req).calibrationId;
  const calibration =
    which === undefined ? await latestCalibration(actor, id) : await getCalibration(actor, id, parseId(String(which), "Calibration not found."));
  return NextResponse.json({ calibration });
});

/** Saves fitted values as a new revision of the recording's lift: { version, axialStiffness, damping, guideFriction? }. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("calibration:save");
  const id = parseId((await ctx.params).id, "Recording not found.");
  return NextResponse.json(await saveCalibration(actor, id, await parseJsonBody(req)), { status: 201 });
});
