import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { resumeStudy } from "@/lib/studies/service";
import { idFrom, type IdParams } from "@/lib/runs/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Runs the unfinished cases of a cancelled or interrupted study again; finished cases are kept. */
export const POST = route<IdParams>(async (_req, ctx) => {
  const user = await requirePermission("study:run");
  return NextResponse.json({ study: await resumeStudy(user, await idFrom(ctx, "No such study.")) });
});
