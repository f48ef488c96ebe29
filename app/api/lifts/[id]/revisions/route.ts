import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { cachedRead } from "@/lib/http/read-cache";
import { queryOf } from "@/lib/api/body";
import { parseId } from "@/lib/api/ids";
import type { RouteContext } from "@/lib/api/params";
import { listRevisions } from "@/lib/lifts/service";

export const runtime = "nodejs";

/** The lift's revisions, newest first: ?page&pageSize&sort=number|createdAt&order. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return cachedRead(req, actor, async () => listRevisions(actor, parseId((await ctx.params).id, "Lift not found."), queryOf(req)));
});
