import { NextResponse } from "next/server";
import { route } from "@/lib/http/route";
import { parseJsonBody, parseQuery } from "@/lib/http/request";
import { requirePermission } from "@/lib/auth/session";
import { createReport, listReports } from "@/lib/reports/service";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** Design-check reports of the organisation (the reviewer queue is status=submitted): ?scenarioId&liftId&authorId&status&q&sort=id|submittedAt|title&order&page&pageSize */
export const GET = route(async (req) => {
  const user = await requirePermission("report:read");
  return NextResponse.json(await listReports(user, parseQuery(req)));
});

/** A draft report of a scenario and one of its finished runs (optionally a study): { scenarioId, runId, studyId?, title?, units? } */
export const POST = route(async (req) => {
  const user = await requirePermission("report:write");
  const report = await createReport(user, await parseJsonBody(req));
  return NextResponse.json({ report }, { status: 201, headers: { Location: `/api/reports/${report.id}` } });
});
