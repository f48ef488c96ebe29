import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { calibrationEvents } from "@/lib/calibration/events";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * Server-sent events of one calibration of the recording (?calibrationId=, required): `progress` while it is
 * queued or running, then one `end`; each carries `{ calibration }` as GET …/calibration answers it.
 */
export const GET = route<RouteContext>(async (req, ctx) => {
  const actor = await requirePermission("logbook:read");
  const id = parseId((await ctx.params).id, "Recording not found.");
  const which = parseQuery(req).calibrationId;
  return calibrationEvents(actor, id, which === undefined ? null : parseId(String(which), "Calibration not found."), req.signal);
});
