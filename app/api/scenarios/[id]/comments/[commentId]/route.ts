import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { deleteComment, updateComment } from "@/lib/comments/service";

export const runtime = "nodejs";

type Ctx = RouteContext<{ id: string; commentId: string }>;

/** The author edits their comment. */
export const PATCH = route(async (req, ctx: Ctx) => {
  const actor = await requirePermission("comment:write");
  const p = await ctx.params;
  const body = await parseJsonBody(req);
  return NextResponse.json(
    await updateComment(actor, parseId(p.id, "Scenario not found."), parseId(p.commentId, "Comment not found."), body),
  );
});

/** The author or an administrator removes a comment. */
export const DELETE = route(async (_req, ctx: Ctx) => {
  const actor = await requirePermission("comment:write");
  const p = await ctx.params;
  return NextResponse.json(await deleteComment(actor, parseId(p.id, "Scenario not found."), parseId(p.commentId, "Comment not found.")));
});
