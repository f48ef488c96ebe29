import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { listRevisions } from "@/lib/lifts/service";

export const runtime = "nodejs";

/** The lift's revisions, newest first: ?page&pageSize&sort=number|createdAt&order. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listRevisions(actor, parseId((await ctx.params).id, "Lift not found."), parseQuery(req)));
});
