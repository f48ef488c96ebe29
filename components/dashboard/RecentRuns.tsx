/**
 * The dashboard's recent runs of the organisation with their headline figures and any failed checks
 * (server component: reads the runs table directly; checks from sim's evaluateChecks on the stored inputs).
 */
import Link from "next/link";
import { Badge } from "@/components/ui/Badge";
import { Card, CardHeader } from "@/components/ui/Card";
import { checksFor } from "@/components/run/compute";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { json } from "@/lib/runs/serialize";
import { studyCaseLabels } from "@/lib/runs/service";
import type { RunStatus } from "@/lib/runs/status";
import { getModels } from "@/models";
import type { Check, Scenario, Summary } from "@/sim";
import { formatDate } from "@/lib/client/dates";

// The checks of a finished run never change (its inputs and summary are frozen), and working them out means
// the design statics of the whole lift: remember them per run version instead of on every dashboard view.
const failedChecks = new Map<string, Check[]>();

function failedChecksOf(key: string, inputs: () => Scenario, summary: Summary): Check[] {
  let hit = failedChecks.get(key);
  if (!hit) {
    hit = checksFor(inputs(), summary).filter((c) => c.state === "fail");
    if (failedChecks.size >= 1_000) failedChecks.delete(failedChecks.keys().next().value!);
    failedChecks.set(key, hit);
  }
  return hit;
}

const TONE = { queued: "neutral", running: "lamp", done: "pass", failed: "fail", cancelled: "neutral" } as const;

export async function RecentRuns({ organisationId, units, limit = 8 }: { organisationId: number; units: UnitSystem; limit?: number }) {
  const { Run, Scenario: ScenarioModel } = getModels();
  const runs = await Run.findAll({
    where: { organisationId },
    attributes: { exclude: ["result"] },
    order: [["id", "DESC"]],
    limit,
  });
  const names = new Map(
    (await ScenarioModel.findAll({ where: { id: [...new Set(runs.map((r) => r.scenarioId))] }, attributes: ["id", "name"] })).map((s) => [s.id, s.name]),
  );
  const studyCases = await studyCaseLabels(runs.map((r) => r.id));
  const rows = runs.map((r) => {
    const summary = json<Summary | null>(r.summary ?? null);
    const failed = summary && r.status === "done" ? failedChecksOf(`${r.id}:${r.version}`, () => json<Scenario>(r.inputs), summary) : [];
    const whatIf = json<Record<string, number> | null>(r.overrides ?? null) !== null;
    return { id: r.id, scenarioId: r.scenarioId, status: r.status as RunStatus, finishedAt: r.finishedAt ?? r.queuedAt, summary, failed, whatIf, studyCase: studyCases.get(r.id) ?? null };
  });
  return (
    <Card data-testid="recent-runs">
      <CardHeader title="Recent runs" description="The latest runs in your organisation, with their headline figures and failed checks." />
      {rows.length === 0 ? (
        <p className="px-5 py-4 text-[13px] text-steel-500">No runs yet. Open a scenario to run it.</p>
      ) : (
        <ul className="divide-y divide-steel-100">
          {rows.map((r) => (
            <li key={r.id} className="grid gap-1 px-5 py-2.5 text-[13px] sm:grid-cols-[minmax(0,1fr)_auto]" data-testid="recent-run">
              <div className="min-w-0">
                <Link href={`/runs/${r.id}`} className="font-semibold text-ink-900 hover:text-lamp-600 hover:underline">
                  Run {r.id}
                </Link>{" "}
                <span className="text-steel-500">· {names.get(r.scenarioId) ?? `scenario ${r.scenarioId}`}</span>
                {r.summary && (
                  <p className="font-mono text-[12px] tabular-nums text-ink-800">
                    peak {formatQuantity(r.summary.peakTension, "force", units)} · SF {r.summary.minSafetyFactor.toFixed(2)} · {r.summary.ardCatches} ARD catch
                    {r.summary.ardCatches === 1 ? "" : "es"} · take-up {formatQuantity(r.summary.takeUpMaxDrop, "smallLength", units, 0)}
                  </p>
                )}
                {r.failed.length > 0 && (
                  <p className="text-[12px] text-fail">
                    <span aria-hidden>✕ </span>Fails: {r.failed.map((c) => c.label).join(", ")}
                  </p>
                )}
              </div>
              <div className="flex items-start gap-2 sm:justify-end">
                <Badge tone={TONE[r.status]}>{r.status}</Badge>
                {/* A what-if run varied the scenario's entry speed, chain speed or take-up mass. */}
                {r.whatIf && <Badge tone="caution">what-if</Badge>}
                {/* A study's case is other inputs than its scenario's: say whose case it is. */}
                {r.studyCase && (
                  <Link href={`/studies/${r.studyCase.studyId}`} title={`Case ${r.studyCase.index} of ${r.studyCase.studyName}`} data-testid="recent-run-study-case">
                    <Badge tone="caution">study case</Badge>
                  </Link>
                )}
                                <span className="text-[11.5px] text-steel-500">{formatDate(r.finishedAt, "dayMonth")}</span>
              </div>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
