"use client";
/**
 * Fit E·A and damping (optionally guide friction) to the recording; show the fit and save as a new lift
 * revision. The fit is a job in the engine pool: the panel starts it, reads its status once (SWR), follows its
 * event stream (useJobEvents) while it is queued or running and shows its progress, then the result or the
 * job's error.
 */
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { useEffect, useRef, useState } from "react";
import useSWR from "swr";
import { Alert } from "@/components/ui/Alert";
import { Button } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Select } from "@/components/ui/Field";
import { SafetyNote } from "@/components/ui/SafetyNote";
import { Table, THead, Td, Th, Tr } from "@/components/ui/Table";
import { ApiError, getJson, sendJson } from "@/lib/client/fetch";
import { useJobEvents } from "@/lib/client/job-events";
import type { CalibrationStatus } from "@/lib/calibration/status";
import { fitVerdict } from "@/lib/calibration/gate";

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

// Headline rows in the reader's units (SI values from the fit; lib/client/units.ts converts).
const ROWS: [keyof Headline, string, (v: number, u: UnitSystem) => string][] = [
  ["peakTension", "Peak tension", (v, u) => formatQuantity(v, "force", u)],
  ["snatchFactor", "Snatch factor", (v) => v.toFixed(2)],
  ["takeUpMaxRise", "Take-up rise", (v, u) => formatQuantity(v, "smallLength", u, u === "us" ? 2 : 0)],
  ["takeUpMaxDrop", "Take-up drop", (v, u) => formatQuantity(v, "smallLength", u, u === "us" ? 2 : 0)],
  ["minSafetyFactor", "Lowest safety factor", (v) => v.toFixed(2)],
  ["takeUpMargin", "Take-up travel margin", (v, u) => formatQuantity(v, "smallLength", u, u === "us" ? 2 : 0)],
];

/** The job as GET /api/recordings/[id]/calibration answers it (lib/calibration/service.ts). */
interface Job {
  id: number;
  scenario: string;
  fitFriction: boolean;
  status: CalibrationStatus;
  progress: number;
  result: Fit | null;
  error: string | null;
}

function errorText(err: unknown): string {
  if (!(err instanceof ApiError)) return err instanceof Error ? err.message : String(err);
  const retry = err.status === 503 ? err.headers?.get("retry-after") : null;
  const issues = err.issues.map((i) => `${i.path}: ${i.message}`).join("; ");
  return [err.message, issues, retry ? `Try again in ${retry} s.` : ""].filter(Boolean).join(" ");
}

/** A figure the run did not produce (null in JSON) shows as a dash. */
const shown = (v: number | null, f: (v: number) => string) => (v === null || !Number.isFinite(v) ? "—" : f(v));

export function CalibrationPanel({
  recordingId,
  scenarios,
  canSave,
  liftVersion,
  units,
  onFitted,
}: {
  recordingId: number;
  scenarios: { id: number; name: string }[];
  canSave: boolean;
  liftVersion: number;
  units: UnitSystem;
  onFitted: (t: number[], y: number[]) => void;
}) {
  const [scenarioId, setScenarioId] = useState(scenarios[0]?.id ?? 0);
  const [friction, setFriction] = useState(false);
  // Null: the recording's latest calibration (a fit started earlier keeps showing after a reload).
  const [jobId, setJobId] = useState<number | null>(null);
  const [starting, setStarting] = useState(false);
  const [msg, setMsg] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const which = jobId ? `?calibrationId=${jobId}` : "";
  const { data, error: readError, mutate } = useSWR<{ calibration: Job | null }>(`/api/recordings/${recordingId}/calibration${which}`, getJson);
  const job = data?.calibration ?? null;
  const active = job?.status === "queued" || job?.status === "running";
  // Each event carries what the status route answers; it replaces the read one.
  const events = useJobEvents<{ calibration: Job | null }>(active ? `/api/recordings/${recordingId}/calibration/events?calibrationId=${job.id}` : null, {
    onUpdate: (d) => void mutate(d, { revalidate: false }),
  });
  const statusError = readError ? errorText(readError) : events.error;
  const fit = job?.status === "done" ? job.result : null;

  // Hand each finished fit's trace to the overlay once.
  const shownFit = useRef<number | null>(null);
  useEffect(() => {
    if (!job || !fit || shownFit.current === job.id) return;
    shownFit.current = job.id;
    onFitted(fit.fittedTrace.t, fit.fittedTrace.takeUp);
  }, [job, fit, onFitted]);

  const run = async () => {
    setStarting(true);
    setMsg(null);
    try {
      const r = await sendJson<{ calibration: Job }>(`/api/recordings/${recordingId}/calibrate`, "POST", { scenarioId, fitFriction: friction });
      setJobId(r.calibration.id);
      await mutate({ calibration: r.calibration }, { revalidate: false });
    } catch (err) {
      setMsg({ tone: "error", text: errorText(err) });
    } finally {
      setStarting(false);
    }
  };
  const save = async () => {
    if (!fit || !job) return;
    try {
      // The server saves the job's own fitted values, and only when the fit passes the quality gate.
      const r = await sendJson<{ currentRevision: { number: number } }>(`/api/recordings/${recordingId}/calibration`, "POST", { version: liftVersion, calibrationId: job.id });
      setMsg({ tone: "success", text: `Saved as revision ${r.currentRevision.number} of the lift.` });
    } catch (err) {
      setMsg({ tone: "error", text: errorText(err) });
    }
  };
  const pct = job ? Math.round(Math.min(1, Math.max(0, job.progress)) * 100) : 0;

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
          <Button busy={starting || active} onClick={() => void run()} disabled={!scenarioId || starting || active} data-testid="run-calibration">
            Fit
          </Button>
        </div>
        {msg && (
          <Alert tone={msg.tone} testId={msg.tone === "error" ? "calibration-error" : "calibration-saved"}>
            {msg.text}
          </Alert>
        )}
        {statusError && (
          <Alert tone="error" testId="calibration-error">
            Could not read the fit&apos;s status: {statusError}
          </Alert>
        )}
        {job && active && (
          <div className="space-y-1" data-testid="calibration-progress">
            <p className="text-[13.5px] text-steel-600">
              {job.status === "queued" ? "Waiting for a free engine worker…" : `Fitting against “${job.scenario}”: ${pct} % of the engine runs done`}
            </p>
            <div className="h-2 w-full overflow-hidden rounded bg-steel-100" role="progressbar" aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100}>
              <div className="h-full bg-lamp-500 transition-all" style={{ width: `${pct}%` }} />
            </div>
          </div>
        )}
        {job?.status === "failed" && (
          <Alert tone="error" title="The fit failed" testId="calibration-error">
            {job.error ?? "The calibration stopped without a message."}
          </Alert>
        )}
        {fit && job && (
          <div className="space-y-3" data-testid="calibration-result">
            <p className="text-[12.5px] text-steel-500">Fitted with the train and entry conditions of “{job.scenario}”.</p>
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
                  <Td>{formatQuantity(fit.initial.axialStiffness, "axialStiffness", units)}</Td>
                  <Td>{formatQuantity(fit.fitted.axialStiffness, "axialStiffness", units)}</Td>
                </Tr>
                <Tr>
                  <Td>Damping</Td>
                  <Td>{formatQuantity(fit.initial.damping, "damping", units)}</Td>
                  <Td>{formatQuantity(fit.fitted.damping, "damping", units)}</Td>
                </Tr>
                <Tr>
                  <Td>Guide friction</Td>
                  <Td>{fit.initial.guideFriction.toFixed(3)}</Td>
                  <Td>{fit.fitted.guideFriction.toFixed(3)}</Td>
                </Tr>
                <Tr>
                  <Td>Fit: RMS residual / R²</Td>
                  <Td>
                    {formatQuantity(fit.quality.initial.rms, "smallLength", units, 2)} / {shown(fit.quality.initial.rSquared, (v) => v.toFixed(3))}
                  </Td>
                  <Td>
                    {formatQuantity(fit.quality.fitted.rms, "smallLength", units, 2)} / {shown(fit.quality.fitted.rSquared, (v) => v.toFixed(3))}
                  </Td>
                </Tr>
                {ROWS.map(([k, label, f]) => (
                  <Tr key={k}>
                    <Td>{label}</Td>
                    <Td>{shown(fit.headline.initial[k], (v) => f(v, units))}</Td>
                    <Td>{shown(fit.headline.fitted[k], (v) => f(v, units))}</Td>
                  </Tr>
                ))}
              </tbody>
            </Table>
            <p className="text-[12.5px] text-steel-500">
              {fit.evaluations} engine runs at {fit.settings.segments} segments over {fit.settings.duration.toFixed(1)} s{fit.converged ? "" : " (stopped at the evaluation budget)"}. Headline figures are from these coarse runs; run the scenario again at full fidelity after saving.
            </p>
            <FitGate fit={fit} units={units} />
            {canSave && (
              <Button variant="secondary" onClick={() => void save()} disabled={!fitVerdict(fit).acceptable} data-testid="save-calibration">
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

/** The quality gate's verdict in words: a fit that fails it can be read here but not saved. */
function FitGate({ fit, units }: { fit: Fit; units: UnitSystem }) {
  const v = fitVerdict(fit, (m) => formatQuantity(m, "smallLength", units, 2));
  return (
    <Alert tone={v.acceptable ? "success" : "caution"} title={v.acceptable ? "The fit passes the quality check" : "This fit cannot be saved as a lift revision"} testId="calibration-gate">
      <ul className="list-disc pl-5">
        {v.findings.map((f, i) => (
          <li key={i}>{f.text}</li>
        ))}
      </ul>
      {!v.acceptable && <p className="mt-1">Read it, then try another scenario, also fit guide friction, or check the recording&apos;s engagement time and units.</p>}
    </Alert>
  );
}
