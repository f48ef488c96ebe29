import { NextResponse } from "next/server";
import { requirePermission } from "@/lib/auth/session";
import { route } from "@/lib/http/route";
import { parseJsonBody } from "@/lib/http/request";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";
import { deleteSession, getSession, updateSession } from "@/lib/training/service";

export const runtime = "nodejs";

const id = async (ctx: RouteContext) => parseId((await ctx.params).id, "Session not found.");

export const GET = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("training:watch");
  return NextResponse.json(await getSession(actor, await id(ctx)));
});

/** Title, description and the whole ordered list of runs with their captions; `version` required. */
export const PATCH = route(async (req, ctx: RouteContext) => {
  const actor = await requirePermission("training:manage");
  return NextResponse.json(await updateSession(actor, await id(ctx), await parseJsonBody(req)));
});

export const DELETE = route(async (_req, ctx: RouteContext) => {
  const actor = await requirePermission("training:manage");
  await deleteSession(actor, await id(ctx));
  return new Response(null, { status: 204 });
});
