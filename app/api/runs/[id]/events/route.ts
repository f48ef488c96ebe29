import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { runEvents } from "@/lib/runs/events";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Server-sent events: `progress` while the run is queued or running, then one `end` with the run. */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:read");
  return runEvents(user, parseId((await ctx.params).id, "Run not found."), req.signal);
});
