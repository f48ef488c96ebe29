import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { runEventStream } from "@/lib/runs/events";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Server-sent events: `progress` while the run is queued or running, then one `end` with the run. */
export const GET = route<RouteContext>(async (req, ctx) => {
  const user = await requirePermission("run:read");
  const stream = await runEventStream(user, parseId((await ctx.params).id, "Run not found."), req.signal);
  return new Response(stream, {
    headers: {
      "Content-Type": "text/event-stream; charset=utf-8",
      "Cache-Control": "no-cache, no-transform",
      Connection: "keep-alive",
      "X-Accel-Buffering": "no",
    },
  });
});
