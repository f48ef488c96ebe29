import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { createComment, listComments } from "@/lib/comments/service";

export const runtime = "nodejs";

/** Review comments on the scenario, oldest first: ?page&pageSize&order&runId. */
export const GET = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("design:read");
  return NextResponse.json(await listComments(actor, parseId((await ctx.params).id, "Scenario not found."), parseQuery(req)));
});

/** A review comment, optionally about one run of the scenario (`runId`). */
export const POST = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("comment:write");
  const id = parseId((await ctx.params).id, "Scenario not found.");
  return NextResponse.json(await createComment(actor, id, await parseJsonBody(req)), { status: 201 });
});
