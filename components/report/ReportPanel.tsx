"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";
import type { UnitSystem } from "@/lib/units/display";
import type { ReportView } from "@/lib/reports/service";
import { Badge } from "@/components/ui/Badge";
import { Button, buttonClass } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { getJson, submitJson } from "@/lib/client/fetch";

async function post(url: string, body?: unknown): Promise<string | null> {
  return (await submitJson(url, "POST", body)).error;
}

/** Design-check reports of a scenario: create from a finished run, open the PDF, submit, approve or return. */
export function ReportPanel({
  scenarioId,
  studyId,
  runIds,
  canWrite,
  canReview,
  userId,
  units,
}: {
  scenarioId: number;
  studyId?: number;
  runIds: { id: number; label: string }[];
  canWrite: boolean;
  canReview: boolean;
  userId: number;
  units: UnitSystem;
}) {
  const { data, mutate } = useSWR<{ items: ReportView[] }>(`/api/reports?scenarioId=${scenarioId}`, getJson);
  const [runId, setRunId] = useState<number | null>(runIds[0]?.id ?? null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function run(fn: () => Promise<string | null>) {
    setBusy(true);
    setError(await fn());
    await mutate();
    setBusy(false);
  }

  return (
    <Card>
      <CardHeader title="Design-check reports" description="A PDF of the inputs, assumptions, statics, dynamic results, checks and this study's window. A reviewer who is not the author signs it off; approval freezes the scenario and its runs." />
      <CardBody className="space-y-3">
        {canWrite && runIds.length ? (
          <div className="flex flex-wrap items-center gap-2 text-sm">
            <label className="text-steel-600" htmlFor="report-run">
              Report on
            </label>
            <select id="report-run" className="h-8 rounded border border-steel-300 px-2" value={runId ?? ""} onChange={(e) => setRunId(Number(e.target.value))}>
              {runIds.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.label} (run {r.id})
                </option>
              ))}
            </select>
            <Button size="sm" busy={busy} data-testid="report-create" onClick={() => run(() => post("/api/reports", { scenarioId, runId, studyId, units }))}>
              Create report
            </Button>
          </div>
        ) : null}
        {error ? <p className="text-sm text-fail" data-testid="report-error">{error}</p> : null}
        <ul className="space-y-2">
          {(data?.items ?? []).map((r) => (
            <li key={r.id} className="rounded border border-steel-200 p-3 text-sm" data-testid="report-item">
              <div className="flex flex-wrap items-center gap-2">
                <Link className="font-semibold hover:underline" href={`/reports/${r.id}`} data-testid="report-link">
                  {r.title}
                </Link>
                <Badge tone={r.status === "approved" ? "pass" : r.status === "returned" ? "caution" : "neutral"}>{r.status}</Badge>
                <a className={buttonClass("secondary", "sm")} href={r.links.pdf} target="_blank" rel="noreferrer">
                  PDF
                </a>
                {canWrite && r.authorId === userId && (r.status === "draft" || r.status === "returned") ? (
                  <Button size="sm" variant="secondary" busy={busy} onClick={() => run(() => post(`/api/reports/${r.id}/submit`))}>
                    Submit for review
                  </Button>
                ) : null}
              </div>
              {r.contentHash ? <p className="mt-1 font-mono text-[11px] text-steel-500">sha256 {r.contentHash}</p> : null}
              {canReview && r.status === "submitted" && r.authorId !== userId ? (
                <p className="mt-2">
                  <Link className={buttonClass("primary", "sm")} href={`/reports/${r.id}`} data-testid="report-review-link">
                    Read the summary and review
                  </Link>
                </p>
              ) : null}
            </li>
          ))}
          {data && !data.items.length ? <li className="text-sm text-steel-500">No report of this scenario yet.</li> : null}
        </ul>
      </CardBody>
    </Card>
  );
}
