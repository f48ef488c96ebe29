import { NextResponse } from "next/server";
import { z } from "zod";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { createReport, listReports } from "@/lib/reports/service";
import { listReportsQuerySchema } from "@/lib/studies/http";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Design-check reports of the organisation: ?scenarioId=&status= */
export const GET = route(async (req) => {
  const user = await requirePermission("report:read");
  return NextResponse.json(await listReports(user, parseQuery(req, listReportsQuerySchema)));
});

/** A draft report of a scenario and one of its finished runs (optionally a study): { scenarioId, runId, studyId?, title?, units? } */
export const POST = route(async (req) => {
  const user = await requirePermission("report:write");
  const report = await createReport(user, await parseJsonBody(req, z.unknown()));
  return NextResponse.json({ report }, { status: 201, headers: { Location: `/api/reports/${report.id}` } });
});
