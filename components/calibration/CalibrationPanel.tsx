"use client";
/** Fit E·A and damping (optionally guide friction) to the recording; show the fit and save as a new lift revision. */
import { useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Select } from "@/components/ui/Field";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, sendJson } from "@/lib/client/fetch";

interface Params {
  axialStiffness: number;
  damping: number;
  guideFriction: number;
}
interface Headline {
  peakTension: number | null;
  snatchFactor: number | null;
  takeUpMaxRise: number | null;
  takeUpMaxDrop: number | null;
  minSafetyFactor: number | null;
  takeUpMargin: number | null;
}
interface Fit {
  initial: Params;
  fitted: Params;
  quality: { initial: { rms: number | null; rSquared: number | null; samples: number }; fitted: { rms: number | null; rSquared: number | null; samples: number } };
  headline: { initial: Headline; fitted: Headline };
  evaluations: number;
  converged: boolean;
  fittedTrace: { t: number[]; takeUp: number[] };
  settings: { segments: number; duration: number };
}

const ROWS: [keyof Headline, string, (v: number) => string][] = [
  ["peakTension", "Peak tension", (v) => `${(v / 1000).toFixed(1)} kN`],
  ["snatchFactor", "Snatch factor", (v) => v.toFixed(2)],
  ["takeUpMaxRise", "Take-up rise", (v) => `${(v * 1000).toFixed(0)} mm`],
  ["takeUpMaxDrop", "Take-up drop", (v) => `${(v * 1000).toFixed(0)} mm`],
  ["minSafetyFactor", "Lowest safety factor", (v) => v.toFixed(2)],
  ["takeUpMargin", "Take-up travel margin", (v) => `${(v * 1000).toFixed(0)} mm`],
];

/** A figure the run did not produce (null in JSON) shows as a dash. */
const shown = (v: number | null, f: (v: number) => string) => (v === null || !Number.isFinite(v) ? "—" : f(v));

export function CalibrationPanel({
  recordingId,
  scenarios,
  canSave,
  liftVersion,
  onFitted,
}: {
  recordingId: number;
  scenarios: { id: number; name: string }[];
  canSave: boolean;
  liftVersion: number;
  onFitted: (t: number[], y: number[]) => void;
}) {
  const [scenarioId, setScenarioId] = useState(scenarios[0]?.id ?? 0);
  const [friction, setFriction] = useState(false);
  const [fit, setFit] = useState<Fit | null>(null);
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ tone: "error" | "success"; text: string } | null>(null);

  const run = async () => {
    setBusy(true);
    setMsg(null);
    try {
      const f = await sendJson<Fit>(`/api/recordings/${recordingId}/calibrate`, "POST", { scenarioId, fitFriction: friction });
      setFit(f);
      onFitted(f.fittedTrace.t, f.fittedTrace.takeUp);
    } catch (err) {
      setMsg({ tone: "error", text: err instanceof ApiError ? `${err.message} ${err.issues.map((i) => `${i.path}: ${i.message}`).join("; ")}` : String(err) });
    } finally {
      setBusy(false);
    }
  };
  const save = async () => {
    if (!fit) return;
    try {
      const r = await sendJson<{ currentRevision: { number: number } }>(`/api/recordings/${recordingId}/calibration`, "POST", {
        version: liftVersion,
        axialStiffness: fit.fitted.axialStiffness,
        damping: fit.fitted.damping,
        ...(friction ? { guideFriction: fit.fitted.guideFriction } : {}),
      });
      setMsg({ tone: "success", text: `Saved as revision ${r.currentRevision.number} of the lift.` });
    } catch (err) {
      setMsg({ tone: "error", text: err instanceof Error ? err.message : String(err) });
    }
  };

  return (
    <Card>
      <CardHeader title="Calibrate the chain" description="Least-squares fit of axial stiffness E·A and damping (and, if chosen, guide friction) so the engine's take-up trace matches the recording. A coarse mesh keeps it to a few seconds." />
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-end gap-3">
          <Field label="Train and entry conditions from" name="cal-scenario" className="w-96">
            <Select id="cal-scenario" value={scenarioId} onChange={(e) => setScenarioId(Number(e.target.value))}>
              {scenarios.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </Select>
          </Field>
          <label className="flex items-center gap-2 text-[13.5px]">
            <input type="checkbox" checked={friction} onChange={(e) => setFriction(e.target.checked)} /> also fit guide friction
          </label>
          <Button busy={busy} onClick={() => void run()} disabled={!scenarioId} data-testid="run-calibration">
            Fit
          </Button>
        </div>
        {msg && <Alert tone={msg.tone}>{msg.text}</Alert>}
        {fit && (
          <div className="space-y-3" data-testid="calibration-result">
            <Table>
              <THead>
                <Tr>
                  <Th> </Th>
                  <Th>Lift revision</Th>
                  <Th>Fitted</Th>
                </Tr>
              </THead>
              <tbody>
                <Tr>
                  <Td>Axial stiffness E·A</Td>
                  <Td>{(fit.initial.axialStiffness / 1e6).toFixed(2)} MN</Td>
                  <Td>{(fit.fitted.axialStiffness / 1e6).toFixed(2)} MN</Td>
                </Tr>
                <Tr>
                  <Td>Damping</Td>
                  <Td>{fit.initial.damping.toFixed(0)} N·s</Td>
                  <Td>{fit.fitted.damping.toFixed(0)} N·s</Td>
                </Tr>
                <Tr>
                  <Td>Guide friction</Td>
                  <Td>{fit.initial.guideFriction.toFixed(3)}</Td>
                  <Td>{fit.fitted.guideFriction.toFixed(3)}</Td>
                </Tr>
                <Tr>
                  <Td>Fit: RMS residual / R²</Td>
                  <Td>
                    {shown(fit.quality.initial.rms, (v) => (v * 1000).toFixed(2))} mm / {shown(fit.quality.initial.rSquared, (v) => v.toFixed(3))}
                  </Td>
                  <Td>
                    {shown(fit.quality.fitted.rms, (v) => (v * 1000).toFixed(2))} mm / {shown(fit.quality.fitted.rSquared, (v) => v.toFixed(3))}
                  </Td>
                </Tr>
                {ROWS.map(([k, label, f]) => (
                  <Tr key={k}>
                    <Td>{label}</Td>
                    <Td>{shown(fit.headline.initial[k], f)}</Td>
                    <Td>{shown(fit.headline.fitted[k], f)}</Td>
                  </Tr>
                ))}
              </tbody>
            </Table>
            <p className="text-[12.5px] text-steel-500">
              {fit.evaluations} engine runs at {fit.settings.segments} segments over {fit.settings.duration.toFixed(1)} s{fit.converged ? "" : " (stopped at the evaluation budget)"}. Headline figures are from these coarse runs; run the scenario again at full fidelity after saving.
            </p>
            {canSave && (
              <Button variant="secondary" onClick={() => void save()} data-testid="save-calibration">
                Save as a new lift revision
              </Button>
            )}
          </div>
        )}
        <SafetyNote />
      </CardBody>
    </Card>
  );
}
