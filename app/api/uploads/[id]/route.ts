import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { downloadHeaders, readUpload } from "@/lib/logbook/uploads";

export const runtime = "nodejs";

/** A stored file, only for the organisation's users: safe type, never rendered as a page. */
export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("logbook:read");
  const { upload, body } = await readUpload(actor, parseId((await ctx.params).id, "File not found."));
  return new Response(new Uint8Array(body), { status: 200, headers: downloadHeaders(upload) });
});
