import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { jsonObject, parseJsonBody, parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import { badRequest } from "@/lib/http/errors";
import { createRecording, listRecordings } from "@/lib/recordings/service";
import { RECORDING_MAX_BYTES } from "@/lib/recordings/schema";

export const runtime = "nodejs";

export const GET = route(async (req) => {
  const actor = await requirePermission("logbook:read");
  const liftId = parseQuery(req).liftId;
  if (!liftId) throw badRequest("Name the lift.", [{ path: "liftId", message: "a lift id is required" }]);
  return NextResponse.json({ recordings: await listRecordings(actor, parseId(liftId, "Lift not found.")) });
});

/** A logger CSV with its column mapping and units; `dryRun: true` only checks. 400 lists every problem. */
export const POST = route(async (req) => {
  const actor = await requirePermission("recording:upload");
  const body = await parseJsonBody(req, jsonObject, RECORDING_MAX_BYTES + 64 * 1024);
  const out = await createRecording(actor, body);
  return NextResponse.json(out, { status: "recording" in out ? 201 : 200 });
});
