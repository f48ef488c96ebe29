import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { queryOf, readObjectBody } from "@/lib/api/body";
import { parseId } from "@/lib/api/ids";
import type { RouteContext } from "@/lib/api/params";
import { createComment, listComments } from "@/lib/comments/service";

export const runtime = "nodejs";

/** Review comments on the scenario, oldest first: ?page&pageSize&order&runId. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return NextResponse.json(await listComments(actor, parseId((await ctx.params).id, "Scenario not found."), queryOf(req)));
});

/** A review comment, optionally about one run of the scenario (`runId`). */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("comment:write");
  const id = parseId((await ctx.params).id, "Scenario not found.");
  return NextResponse.json(await createComment(actor, id, await readObjectBody(req)), { status: 201 });
});
