"use client";
import Link from "next/link";
import { useMemo, useState } from "react";
import useSWR from "swr";
import type { UnitSystem } from "@/lib/client/units";
import type { StudyView } from "@/lib/studies/service";
import { Badge } from "@/components/ui/Badge";
import { Button, buttonClass } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { SAFETY_CAUTION } from "@/components/ui/SafetyNote";
import { ReportPanel } from "@/components/report/ReportPanel";
import { FIGURES, figure, paramHeader, paramValue, unitLabel } from "./format";
import { StudyLinePlots, meetsSurge } from "./StudyCharts";
import { OperatingMap } from "./OperatingMap";
import { getJson } from "@/lib/client/fetch";
import { useJobEvents } from "@/lib/client/job-events";

function duration(s: number | null): string {
  if (s === null) return "estimating…";
  if (s < 60) return `${s} s`;
  return `${Math.floor(s / 60)} min ${s % 60} s`;
}

export function StudyDetail({
  id,
  units,
  canRun,
  canWriteReport,
  canReview,
  canReadReports,
  userId,
}: {
  id: number;
  units: UnitSystem;
  canRun: boolean;
  canWriteReport: boolean;
  canReview: boolean;
  canReadReports: boolean;
  userId: number;
}) {
  const { data, error, mutate } = useSWR<{ study: StudyView }>(`/api/studies/${id}?units=${units}`, getJson);
  const following = data?.study.status === "running" || data?.study.status === "queued";
  // While it runs, each event carries the whole study as the route above answers it (null once deleted:
  // reading it again then says so).
  const events = useJobEvents<{ study: StudyView | null }>(following ? `/api/studies/${id}/events?units=${units}` : null, {
    onUpdate: (d) => void (d.study ? mutate({ study: d.study }, { revalidate: false }) : mutate()),
  });
  const [sort, setSort] = useState<{ key: string; dir: 1 | -1 }>({ key: "idx", dir: 1 });
  const [busy, setBusy] = useState(false);
  const [actionError, setActionError] = useState<string | null>(null);
  const study = data?.study;
  const chains = useMemo(() => new Map((study?.chains ?? []).map((c) => [c.id, c.designation])), [study?.chains]);

  const rows = useMemo(() => {
    const cs = [...(study?.cases ?? [])];
    const val = (c: (typeof cs)[number]): number | string => {
      if (sort.key === "idx") return c.idx;
      if (sort.key === "acceptable") return c.acceptable === null ? -1 : Number(c.acceptable);
      if (sort.key.startsWith("p:")) return c.values[sort.key.slice(2)] ?? "";
      return c.headline?.[sort.key] ?? Number.NEGATIVE_INFINITY;
    };
    cs.sort((a, b) => {
      const va = val(a);
      const vb = val(b);
      return (va < vb ? -1 : va > vb ? 1 : a.idx - b.idx) * sort.dir;
    });
    return cs;
  }, [study?.cases, sort]);

  if (error) return <p className="text-fail">Could not load the study: {String(error.message)}</p>;
  if (!study) return <p className="text-steel-500">Loading the study…</p>;
  const finished = study.casesDone + study.casesFailed;
  const pct = study.casesTotal ? Math.round((100 * finished) / study.casesTotal) : 0;
  const active = study.status === "running" || study.status === "queued";
  const dispatch = study.parameters.some((p) => p.key === "dispatchInterval");

  async function act(what: "cancel" | "resume") {
    setBusy(true);
    setActionError(null);
    const r = await fetch(`/api/studies/${id}/${what}`, { method: "POST" });
    if (!r.ok) setActionError((await r.json().catch(() => ({}))).error ?? `HTTP ${r.status}`);
    await mutate();
    setBusy(false);
  }

  const th = (key: string, label: string) => (
    <th className="cursor-pointer select-none px-2 py-1.5 text-left font-semibold" onClick={() => setSort((s) => ({ key, dir: s.key === key ? (-s.dir as 1 | -1) : 1 }))}>
      {label}
      {sort.key === key ? (sort.dir === 1 ? " ▲" : " ▼") : ""}
    </th>
  );

  return (
    <div className="space-y-5">
      <Card>
        <CardHeader
          title={study.name}
          description={`${study.parameters.map((p) => paramHeader(p.key, units)).join(" × ")} · ${study.casesTotal} cases · ${study.mode === "queue" ? "BullMQ workers" : "worker pool"}`}
          actions={
            canRun ? (
              <div className="flex gap-2">
                {active ? (
                  <Button variant="danger" size="sm" busy={busy} onClick={() => act("cancel")} data-testid="study-cancel">
                    Cancel
                  </Button>
                ) : study.casesDone < study.casesTotal ? (
                  <Button variant="secondary" size="sm" busy={busy} onClick={() => act("resume")} data-testid="study-resume">
                    Resume
                  </Button>
                ) : null}
              </div>
            ) : null
          }
        />
        <CardBody>
          <div className="mb-2 flex items-center gap-3 text-sm">
            <Badge tone={study.status === "done" ? "pass" : study.status === "failed" ? "fail" : study.status === "cancelled" ? "neutral" : "lamp"}>{study.status}</Badge>
            <span data-testid="study-progress">
              {finished} / {study.casesTotal} cases
            </span>
            {study.casesFailed ? <span className="text-fail">{study.casesFailed} failed</span> : null}
            {active ? <span className="text-steel-500">time left: {duration(study.secondsLeft)}</span> : null}
          </div>
          <div className="h-2 w-full overflow-hidden rounded bg-steel-100" role="progressbar" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100}>
            <div className="h-full bg-lamp-500 transition-all" style={{ width: `${pct}%` }} />
          </div>
          <p className={`mt-2 text-[12.5px] ${study.mesh && !study.mesh.settled ? "font-semibold text-[#7a5400]" : "text-steel-600"}`} data-testid="study-mesh">
            {study.mesh
              ? study.mesh.reason
              : active
                ? "Choosing the mesh: the first and last case at the scenario's segments and at twice as many, until the check figures agree…"
                : "Mesh not checked for this study: the cases ran at the scenario's segments."}
          </p>
          {actionError ? <p className="mt-2 text-sm text-fail">{actionError}</p> : null}
          {events.error ? <p className="mt-2 text-sm text-fail">Could not follow the study&apos;s progress: {events.error}</p> : null}
        </CardBody>
      </Card>

      <Card>
        <CardHeader title="Recommended operating window" description={study.requireNoArdCatch ? "Acceptable: no check fails, and no settle-back onto the ARD." : "Acceptable: no check fails (ARD catches allowed)."} />
        <CardBody>
          <p className="text-[15px] font-semibold text-ink-900" data-testid="study-window">
            {study.regionText ?? study.window?.text}
          </p>
          {study.regionText && study.window?.text ? (
            <p className="mt-1 text-[13px] text-steel-600" data-testid="study-window-rows">
              Row by row: {study.window.text}
            </p>
          ) : null}
          {/* The page footer carries the caution too; here it stands beside the window itself. */}
          <p className="mt-2 text-[12.5px] text-steel-500">{SAFETY_CAUTION}</p>
        </CardBody>
      </Card>

      {study.region ? (
        <Card>
          <CardHeader title="Operating map" description="Each case of the grid, coloured by its worst check; contours of the governing check; the recommended window outlined." />
          <CardBody>
            <div data-testid="study-map">
              <OperatingMap region={study.region} units={units} />
            </div>
          </CardBody>
        </Card>
      ) : null}

      <Card>
        <CardHeader title="Figures against the varied input" />
        <CardBody>
          <StudyLinePlots study={study} units={units} />
        </CardBody>
      </Card>

      <Card>
        <CardHeader
          title="Cases"
          description="Click a heading to sort. Open a case to see its run in the workspace."
          actions={
            <div className="flex gap-2">
              <a className={buttonClass("secondary", "sm")} href={`/api/studies/${id}/export?format=csv&units=${units}`} data-testid="export-csv">
                CSV
              </a>
              <a className={buttonClass("secondary", "sm")} href={`/api/studies/${id}/export?format=xlsx&units=${units}`} data-testid="export-xlsx">
                XLSX
              </a>
            </div>
          }
        />
        <CardBody className="overflow-x-auto">
          <table className="w-full text-[12.5px]" data-testid="study-cases">
            <thead className="border-b border-steel-200 text-steel-600">
              <tr>
                {th("idx", "#")}
                {study.parameters.map((p) => th(`p:${p.key}`, paramHeader(p.key, units)))}
                {th("acceptable", "Acceptable")}
                <th className="px-2 py-1.5 text-left font-medium">Failing check</th>
                {FIGURES.map((f) => th(f.key, `${f.label}${unitLabel(f.quantity, units)}`))}
                {dispatch ? <th className="px-2 py-1.5 text-left font-medium">Pick-up in release surge</th> : null}
                <th className="px-2 py-1.5" />
              </tr>
            </thead>
            <tbody>
              {rows.map((c) => (
                <tr key={c.id} className="border-b border-steel-100" data-testid="study-case-row">
                  <td className="px-2 py-1">{c.idx + 1}</td>
                  {study.parameters.map((p) => (
                    <td key={p.key} className="px-2 py-1">
                      {paramValue(p.key, c.values[p.key], units, chains)}
                    </td>
                  ))}
                  <td className="px-2 py-1">
                    {c.status !== "done" ? (
                      <span className="text-steel-500">{c.status}</span>
                    ) : c.acceptable ? (
                      <Badge tone="pass">yes</Badge>
                    ) : (
                      <Badge tone="fail">no</Badge>
                    )}
                    {c.mesh && !c.mesh.verdictSettled && (
                      <span className="ml-1 text-[11px] font-semibold text-[#7a5400]" title={c.mesh.message} data-testid="case-mesh-unsettled">
                        not settled on the mesh
                      </span>
                    )}
                  </td>
                  <td className="px-2 py-1" data-testid="case-failing">
                    {((c.checks ?? []) as { state: string; label: string }[])
                      .filter((ch) => ch.state === "fail")
                      .map((ch) => ch.label)
                      .join(", ") || "—"}
                  </td>
                  {FIGURES.map((f) => (
                    <td key={f.key} className="px-2 py-1 tabular-nums">
                      {figure(c.headline?.[f.key], f.quantity, units, f.digits)}
                    </td>
                  ))}
                  {dispatch ? (
                    <td className="px-2 py-1" data-testid="case-surge">
                      {c.status !== "done" || c.headline?.firstReleaseTime == null || c.headline?.secondPickupTime == null ? "—" : meetsSurge(c) ? "yes" : "no"}
                    </td>
                  ) : null}
                  <td className="px-2 py-1">
                    {c.runId ? (
                      <Link className="text-ink-800 underline" href={`/runs/${c.runId}`}>
                        Open
                      </Link>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </CardBody>
      </Card>

      {canReadReports ? (
        <ReportPanel
          scenarioId={study.scenarioId}
          studyId={study.id}
          runIds={(study.cases ?? []).filter((c) => c.status === "done" && c.runId).map((c) => ({ id: c.runId!, label: `case ${c.idx + 1}` }))}
          canWrite={canWriteReport}
          canReview={canReview}
          userId={userId}
          units={units}
        />
      ) : null}
    </div>
  );
}
