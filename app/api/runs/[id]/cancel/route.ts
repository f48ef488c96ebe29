import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { requirePermission } from "@/lib/auth/session";
import { cancelRun } from "@/lib/runs/service";
import { idFrom, type IdParams } from "@/lib/runs/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Cancels a queued or running run (409 when it has already finished). */
export const POST = route<IdParams>(async (_req, ctx) => {
  const user = await requirePermission("run:cancel");
  return NextResponse.json(await cancelRun(user, await idFrom(ctx, "No such run.")));
});
