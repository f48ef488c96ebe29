/**
 * The dashboard's recent runs of the organisation with their headline figures and any failed checks
 * (the lines come from lib/runs/recent.ts: scenario runs that are not study cases, checks worked out there).
 */
import Link from "next/link";
import { Badge } from "@/components/ui/Badge";
import { Card, CardHeader } from "@/components/ui/Card";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import type { RecentRun } from "@/lib/runs/recent";
import { formatDate } from "@/lib/client/dates";

const TONE = { queued: "neutral", running: "lamp", done: "pass", failed: "fail", cancelled: "neutral" } as const;

export function RecentRuns({ runs, units }: { runs: RecentRun[]; units: UnitSystem }) {
  return (
    <Card data-testid="recent-runs">
      <CardHeader title="Recent runs" description="The latest runs of your organisation's scenarios, with their headline figures and failed checks. A study's cases are listed with their study." />
      {runs.length === 0 ? (
        <p className="px-5 py-4 text-[13px] text-steel-500">No runs yet. Open a scenario to run it.</p>
      ) : (
        <ul className="divide-y divide-steel-100">
          {runs.map((r) => (
            <li key={r.id} className="grid gap-1 px-5 py-2.5 text-[13px] sm:grid-cols-[minmax(0,1fr)_auto]" data-testid="recent-run">
              <div className="min-w-0">
                <Link href={`/runs/${r.id}`} className="font-semibold text-ink-900 hover:text-lamp-600 hover:underline">
                  Run {r.id}
                </Link>{" "}
                <span className="text-steel-500">· {r.scenarioName ?? `scenario ${r.scenarioId}`}</span>
                {r.headline && (
                  <p className="font-mono text-[12px] tabular-nums text-ink-800">
                    peak {formatQuantity(r.headline.peakTension, "force", units)} · SF {r.headline.minSafetyFactor.toFixed(2)} · {r.headline.ardCatches} ARD catch
                    {r.headline.ardCatches === 1 ? "" : "es"} · take-up {formatQuantity(r.headline.takeUpMaxDrop, "smallLength", units, 0)}
                  </p>
                )}
                {r.failedChecks.length > 0 && (
                  <p className="text-[12px] text-fail">
                    <span aria-hidden>✕ </span>Fails: {r.failedChecks.map((c) => c.label).join(", ")}
                  </p>
                )}
              </div>
              <div className="flex items-start gap-2 sm:justify-end">
                <Badge tone={TONE[r.status]}>{r.status}</Badge>
                {/* A what-if run varied the scenario's entry speed, chain speed or take-up mass. */}
                {r.whatIf && <Badge tone="caution">what-if</Badge>}
                <span className="text-[11.5px] text-steel-500">{formatDate(r.at, "dayMonth")}</span>
              </div>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
