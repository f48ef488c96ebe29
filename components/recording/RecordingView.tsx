"use client";
/** A stored recording: overlay on a run of the same lift (aligned at engagement) and the calibration panel. */
import { useEffect, useState } from "react";
import { Alert } from "@/components/ui/Alert";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { Field, Options, Select } from "@/components/ui/Field";
import { getJson } from "@/lib/client/fetch";
import type { Jsonify } from "@/lib/client/jsonify";
import type { OverlaySeries } from "@/lib/recordings/align";
import { CalibrationPanel } from "@/components/calibration/CalibrationPanel";
import type { UnitSystem } from "@/lib/client/units";
import { OverlayChart, type Trace } from "./OverlayChart";

type OverlayJson = Jsonify<OverlaySeries>;

export function RecordingView({
  recordingId,
  runs,
  scenarios,
  canCalibrate,
  canSave,
  liftVersion,
  lengthUnit,
  units,
}: {
  recordingId: number;
  runs: { id: number; label: string }[];
  scenarios: { id: number; name: string }[];
  canCalibrate: boolean;
  canSave: boolean;
  liftVersion: number;
  lengthUnit: "mm" | "in";
  units: UnitSystem;
}) {
  const [runId, setRunId] = useState<number | null>(runs[0]?.id ?? null);
  const [overlay, setOverlay] = useState<OverlayJson | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [fitted, setFitted] = useState<Trace | null>(null);
  const scale = lengthUnit === "in" ? 1 / 0.0254 : 1000;

  useEffect(() => {
    if (!runId) return;
    getJson<OverlayJson>(`/api/recordings/${recordingId}/overlay?runId=${runId}`)
      .then((o) => {
        setOverlay(o);
        setError(null);
      })
      .catch((e) => setError(e instanceof Error ? e.message : String(e)));
  }, [recordingId, runId]);

  const traces: Trace[] = overlay
    ? [
        { label: "recorded take-up", t: overlay.recording.t, y: overlay.recording.takeUp, colour: "#1f6fb2" },
        { label: `run ${runId} take-up`, t: overlay.run.t, y: overlay.run.takeUp.map((v) => v - (overlay.run.takeUp[0] ?? 0)), colour: "#b86e00" },
        ...(fitted ? [{ ...fitted, t: fitted.t.map((x) => x + overlay.shift) }] : []),
      ]
    : [];

  return (
    <div className="space-y-5">
      <Card>
        <CardHeader title="Overlay on a simulated run" description="Take-up drop from rest (positive down), the recording moved in time so its engagement falls on the run's first dog contact." />
        <CardBody className="space-y-3">
          {runs.length === 0 ? (
            <p className="text-[13.5px] text-steel-500">This lift has no finished run yet: start one from a scenario.</p>
          ) : (
            <Field label="Run" name="overlay-run" className="w-96">
              <Select id="overlay-run" value={runId ?? ""} onChange={(e) => setRunId(Number(e.target.value))}>
                <Options items={runs} label={(r) => r.label} />
              </Select>
            </Field>
          )}
          {error && <Alert tone="error">{error}</Alert>}
          {overlay && (
            <>
              <OverlayChart traces={traces} unit={lengthUnit} scale={scale} testId="overlay-chart" />
              <p className="text-[13px] text-steel-600" data-testid="overlay-shift">
                {overlay.aligned ? `Aligned at engagement: the recording is shifted by ${overlay.shift.toFixed(3)} s.` : "No engagement time in the recording: aligned at its start."}
              </p>
            </>
          )}
        </CardBody>
      </Card>
      {canCalibrate && (
        <CalibrationPanel recordingId={recordingId} scenarios={scenarios} canSave={canSave} liftVersion={liftVersion} units={units} onFitted={(t, y) => setFitted({ label: "fitted run take-up", t, y, colour: "#2e8b57" })} />
      )}
    </div>
  );
}
