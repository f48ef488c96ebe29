import { route } from "@/lib/http/route";
import { parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { studyListEvents } from "@/lib/studies/events";
import { studyIdsQuerySchema } from "@/lib/studies/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * Server-sent events of the listed studies (?ids=3,7,12): `progress` with `{ items }` (status and case counts)
 * whenever one changes, then one `end` once none of them is queued or running.
 */
export const GET = route(async (req) => {
  const user = await requirePermission("study:read");
  const { ids } = parseQuery(req, studyIdsQuerySchema);
  return studyListEvents(user, ids, req.signal);
});
