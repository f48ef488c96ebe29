"use client";
/** The lift's logbook levels: elongation limit and warning, take-up warning, forecast horizon. */
import { useState } from "react";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Input } from "@/components/ui/Field";
import { ApiError, issueMap, sendJson } from "@/lib/client/fetch";
import type { TrendJson } from "./types";
import { readTyped, type TypedField } from "./typed";

const FIELDS: readonly TypedField[] = [
  { key: "elongationLimit", label: "Elongation limit", unit: "%", required: true },
  { key: "elongationWarning", label: "Elongation warning", unit: "%", required: true },
  { key: "takeUpWarning", label: "Take-up warning", unit: "% of usable travel", required: true },
  { key: "horizonDays", label: "Forecast horizon", unit: "days", required: true },
];

export function SettingsForm({ liftId, trend, onSaved }: { liftId: number; trend: TrendJson; onSaved: () => void }) {
  const s = trend.settings;
  const [v, setV] = useState({ elongationLimit: String(s.elongationLimit), elongationWarning: String(s.elongationWarning), takeUpWarning: String(s.takeUpWarning * 100), horizonDays: String(s.horizonDays) });
  const [issues, setIssues] = useState<Record<string, string>>({});
  const [msg, setMsg] = useState<string | null>(null);
  const save = async () => {
    const { values: n, issues: local } = readTyped(v, FIELDS);
    if (Object.keys(local).length) {
      setIssues(local);
      setMsg("Check the marked fields. Nothing was saved.");
      return;
    }
    try {
      await sendJson(`/api/logbook/lifts/${liftId}/settings`, "PUT", {
        version: s.version,
        elongationLimit: n.elongationLimit,
        elongationWarning: n.elongationWarning,
        takeUpWarning: n.takeUpWarning! / 100,
        horizonDays: n.horizonDays,
      });
      setIssues({});
      setMsg("Levels saved.");
      onSaved();
    } catch (err) {
      if (err instanceof ApiError) setIssues(issueMap(err.issues));
      setMsg(err instanceof Error ? err.message : String(err));
    }
  };
  const f = (k: keyof typeof v, label: string) => (
    <Field label={label} name={k} error={issues[k]}>
      <Input id={k} inputMode="decimal" value={v[k]} onChange={(e) => setV({ ...v, [k]: e.target.value })} />
    </Field>
  );
  return (
    <Card>
      <CardHeader title="Levels for this lift" description="The replacement limit defaults to 3 % (common practice for roller chain, no source); the manufacturer's figure governs." />
      <CardBody>
        <div className="grid gap-3 md:grid-cols-4">
          {f("elongationLimit", "Elongation limit, %")}
          {f("elongationWarning", "Elongation warning, %")}
          {f("takeUpWarning", "Take-up warning, % of usable travel")}
          {f("horizonDays", "Forecast horizon, days")}
        </div>
        <div className="mt-3 flex items-center gap-3">
          <Button variant="secondary" onClick={() => void save()}>
            Save levels
          </Button>
          {msg && (
            <span className="text-[13px] text-steel-700" data-testid="settings-message">
              {msg}
            </span>
          )}
        </div>
      </CardBody>
    </Card>
  );
}
