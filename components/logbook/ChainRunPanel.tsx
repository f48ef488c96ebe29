"use client";
/**
 * "Run with today's chain": pick a scenario of this lift; one click makes (or opens) its copy with the chain's
 * elongation from the newest logbook reading and starts the run, then opens the scenario with its run.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card } from "@/components/ui/Card";
import { Select } from "@/components/ui/Field";
import { ApiError, sendJson } from "@/lib/client/fetch";
import { useList } from "@/lib/client/hooks";
import type { ChainRunView } from "@/lib/logbook/chain-run";
import type { ScenarioJson } from "@/components/scenario/types";

export function ChainRunPanel({ liftId, latest }: { liftId: number; latest: number | null }) {
  const router = useRouter();
  const scenarios = useList<ScenarioJson>("/api/scenarios", { pageSize: 100, liftId });
  const [chosen, setChosen] = useState<string>("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const items = scenarios.data?.items ?? [];
  const scenarioId = chosen || (items[0] ? String(items[0].id) : "");
  if (latest === null) return null;
  async function go() {
    setError(null);
    setBusy(true);
    try {
      const r = await sendJson<ChainRunView>(`/api/logbook/lifts/${liftId}/chain-run`, "POST", { scenarioId: Number(scenarioId) });
      router.push(`/scenarios/${r.scenario.id}`);
    } catch (err) {
      setError(err instanceof ApiError ? [err.message, ...err.issues.map((i) => i.message)].join(" · ") : "The run could not be started.");
      setBusy(false);
    }
  }
  return (
    <Card>
      <div className="flex flex-wrap items-end gap-3 px-4 py-3" data-testid="chain-run">
        <div className="min-w-[16rem] flex-1">
          <h3 className="text-[13.5px] font-bold text-ink-900">Run with today&apos;s chain</h3>
          <p className="text-[12px] text-steel-500">
            A copy of the scenario with the chain elongation of the newest reading ({latest.toFixed(2)} %), run at once. Results support, and never replace, review by a qualified engineer.
          </p>
        </div>
        <div>
          <label htmlFor="chain-run-scenario" className="mb-1 block text-[12.5px] font-semibold text-ink-800">Scenario of this lift</label>
          <Select id="chain-run-scenario" className="h-9" value={scenarioId} disabled={busy || !items.length} onChange={(e) => setChosen(e.target.value)}>
            {!items.length && <option value="">No scenarios of this lift</option>}
            {items.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </Select>
        </div>
        <Button type="button" busy={busy} disabled={!scenarioId} onClick={() => void go()} data-testid="chain-run-start">
          Run with today&apos;s chain
        </Button>
      </div>
      {error && (
        <div className="px-4 pb-3">
          <Alert tone="error" title="Not started">{error}</Alert>
        </div>
      )}
    </Card>
  );
}
