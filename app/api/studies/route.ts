import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { createStudy, listStudies } from "@/lib/studies/service";
import { listStudiesQuerySchema } from "@/lib/studies/http";
import { z } from "zod";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Studies of the organisation, newest first: ?scenarioId=&page=&pageSize= */
export const GET = route(async (req) => {
  const user = await requirePermission("study:read");
  return NextResponse.json(await listStudies(user, parseQuery(req, listStudiesQuerySchema)));
});

/** Creates a study (every case validated first) and starts it; 202 with the study. */
export const POST = route(async (req) => {
  const user = await requirePermission("study:run");
  const body = await parseJsonBody(req, z.unknown());
  const study = await createStudy(user, body);
  return NextResponse.json({ study }, { status: 202, headers: { Location: `/api/studies/${study.id}` } });
});
