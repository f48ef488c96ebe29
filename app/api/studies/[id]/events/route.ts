import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { studyEvents } from "@/lib/studies/events";
import { unitsQuerySchema } from "@/lib/studies/http";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * Server-sent events of a study (?units=si|us for the window sentence): `progress` while it runs, then one
 * `end`; each carries `{ study }` as GET /api/studies/[id] answers it.
 */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("study:read");
  const id = parseId((await ctx.params).id, "Study not found.");
  const { units } = parseQuery(req, unitsQuerySchema);
  return studyEvents(user, id, { units }, req.signal);
});
