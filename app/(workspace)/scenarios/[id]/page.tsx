import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { ScenarioRunView } from "@/components/run/ScenarioRunView";
import { ScenarioEditor } from "@/components/scenario/ScenarioEditor";
import { FrozenScenarioBanner } from "@/components/report/FrozenScenarioBanner";
import { approvingReport } from "@/lib/reports/service";
import { ReportPanel } from "@/components/report/ReportPanel";
import { listRuns } from "@/lib/runs/service";
import { LOADING_LABELS, type ScenarioJson } from "@/components/scenario/types";
import { Badge } from "@/components/ui/Badge";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { HttpError } from "@/lib/http/errors";
import { resolveEngineScenario } from "@/lib/scenarios/resolve";
import { loadScenarioParts, scenarioView } from "@/lib/scenarios/service";
import type { Scenario } from "@/sim";

export const metadata: Metadata = { title: "Scenario" };

export default async function ScenarioPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await pageUser("/scenarios/[id]");
  const id = toId((await params).id);
  if (id === null) notFound();
  let view: ScenarioJson;
  let engine: Scenario | null = null;
  try {
    const parts = await loadScenarioParts(user, id);
    view = JSON.parse(JSON.stringify(scenarioView(parts.scenario, parts))) as ScenarioJson;
    if (parts.revision && parts.train) {
      const r = resolveEngineScenario(parts.scenario, parts.revision, parts.train, parts.followerTrains);
      if (r.ok) engine = JSON.parse(JSON.stringify(r.scenario)) as Scenario;
    }
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const sp = await searchParams;
  const t = typeof sp.t === "string" ? Number(sp.t) : undefined;
  const canWrite = can(user.role, "design:write") && !view.archivedAt && !view.frozenAt;
  const frozenBy = view.frozenAt && can(user.role, "report:read") ? await approvingReport(user, view.id) : null;
  // Reports are drawn from the scenario's own finished runs (a study's cases report from the study's page).
  const reportRuns = can(user.role, "report:read")
    ? (await listRuns(user, view.id, { page: 1, pageSize: 20, sort: "newest", source: "own", status: "done" })).items.map((r) => ({
        id: r.id,
        label: r.overrides ? "what-if" : "scenario as saved",
      }))
    : [];
  return (
    <>
      <PageHeader
        eyebrow="Scenario · run view"
        title={view.name}
        description={
          <>
            <Link className="font-semibold text-ink-800 hover:underline" href={`/lifts/${view.liftId}`}>
              {view.liftName}
            </Link>{" "}
            r{view.liftRevisionNumber}
            {!view.pinnedToCurrent && (
              <Badge tone="caution" className="mx-1.5">
                pinned to an older revision
              </Badge>
            )}{" "}
            ·{" "}
            <Link className="font-semibold text-ink-800 hover:underline" href={`/trains/${view.trainId}`}>
              {view.trainName}
            </Link>{" "}
            · {view.loading === "riders" ? `${view.riderCount} riders` : LOADING_LABELS[view.loading]}
            {view.notes ? <span className="mt-1 block" data-user-text>{view.notes}</span> : null}
          </>
        }
      />
      <div className="space-y-5">
        {view.frozenAt && (
          <FrozenScenarioBanner
            scenarioId={view.id}
            frozenAt={String(view.frozenAt)}
            report={frozenBy}
            canCopy={can(user.role, "design:write")}
          />
        )}
        {canWrite && (
          <details className="rounded-lg border border-steel-300/70 bg-white" data-testid="edit-scenario">
            <summary className="cursor-pointer px-4 py-2.5 text-[13px] font-semibold text-ink-900">Edit the scenario</summary>
            <div className="border-t border-steel-100 p-4">
              <ScenarioEditor scenario={view} units={user.units} canWrite={canWrite} engine={engine} />
            </div>
          </details>
        )}
        <ScenarioRunView
          scenarioId={view.id}
          scenario={engine}
          units={user.units}
          canStart={can(user.role, "run:start")}
          initialT={t !== undefined && Number.isFinite(t) ? t : undefined}
          fileStem={`scenario-${view.id}`}
        />
        {can(user.role, "report:read") && (
          <ReportPanel
            scenarioId={view.id}
            runIds={reportRuns}
            canWrite={can(user.role, "report:write")}
            canReview={can(user.role, "report:review")}
            userId={user.id}
            units={user.units}
          />
        )}
      </div>
    </>
  );
}
