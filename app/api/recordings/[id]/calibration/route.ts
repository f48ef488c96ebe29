import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { readObjectBody } from "@/lib/api/body";
import { parseId } from "@/lib/api/ids";
import type { RouteContext } from "@/lib/api/params";
import { saveCalibration } from "@/lib/recordings/service";

export const runtime = "nodejs";

/** Saves fitted values as a new revision of the recording's lift: { version, axialStiffness, damping, guideFriction? }. */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("calibration:save");
  const id = parseId((await ctx.params).id, "Recording not found.");
  return NextResponse.json(await saveCalibration(actor, id, await readObjectBody(req)), { status: 201 });
});
