import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { resumeStudy } from "@/lib/studies/service";
import { parseId } from "@/lib/http/ids";
import type { RouteContext } from "@/lib/http/params";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Runs the unfinished cases of a cancelled or interrupted study again; finished cases are kept. */
export const POST = route<RouteContext>(async (_req, ctx) => {
  const user = await requirePermission("study:run");
  return NextResponse.json({ study: await resumeStudy(user, parseId((await ctx.params).id, "Study not found.")) });
});
