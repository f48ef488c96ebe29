import type { Metadata } from "next";
import Link from "next/link";
import { RecordingView } from "@/components/recording/RecordingView";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getRecording } from "@/lib/recordings/service";
import { recordedSettleBack } from "@/lib/recordings/settle";
import { getModels } from "@/models";
import { runPickerOptions } from "@/lib/runs/picker";

export const metadata: Metadata = { title: "Recording" };

export default async function RecordingPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/logbook/recordings/[id]");
  const rec = await pageRow(params, (id) => getRecording(user, id));
  const { Lift, LiftRevision, Scenario, Train } = getModels();
  const lift = await Lift.findByPk(rec.recording.liftId);
  const revisions = await LiftRevision.findAll({ where: { liftId: rec.recording.liftId }, attributes: ["id", "number"] });
  const scenarios = await Scenario.findAll({ where: { liftId: rec.recording.liftId, organisationId: user.organisationId }, order: [["name", "ASC"]] });
  const runOptions = await runPickerOptions(user, { units: user.units, liftRevisionIds: revisions.map((r) => r.id), limit: 50 });
  // The settle-back account needs the lift's design and a train: the first scenario's.
  const rev = await LiftRevision.findByPk(rec.recording.liftRevisionId);
  const train = scenarios[0] ? await Train.findByPk(scenarios[0].trainId) : null;
  const settle =
    rev && train
      ? recordedSettleBack(
          { t: rec.series.t, trainSpeed: rec.series.trainSpeed, trainPosition: rec.series.trainPosition, engagementTime: rec.recording.engagementTime },
          {
            lift: rev.geometry as { angle: number; chainFrom: number; chainTo: number },
            chain: rev.chain as { axialStiffness: number },
            drive: rev.drive as { speed: number },
            train: { cars: train.cars, carMass: train.carMassEmpty + train.seatsPerCar * train.riderMass, dogOffset: train.dogOffset, rollingResistance: train.rollingResistance, entrySpeed: 0 },
            gravity: 9.80665,
          },
          user.units,
        )
      : null;
  return (
    <>
      <PageHeader
        eyebrow="Recording"
        title={rec.recording.name}
        description={`${lift?.name ?? ""} · ${rec.recording.sampleCount} samples over ${rec.recording.duration.toFixed(1)} s · channels: ${rec.recording.channels.join(", ")}`}
      />
      <div className="mb-4 flex gap-4 text-[13.5px]">
        <Link className="font-semibold text-lamp-600 hover:underline" href={`/logbook?lift=${rec.recording.liftId}`}>
          Back to the logbook
        </Link>
        {rec.recording.fileUrl && (
          <a className="font-semibold text-lamp-600 hover:underline" href={rec.recording.fileUrl}>
            Download the file as received
          </a>
        )}
      </div>
      {settle && (
        <aside className="mb-5 rounded-lg border border-fail/40 bg-white px-4 py-3" data-testid="recorded-settle-back">
          <p className="font-mono text-[10.5px] font-semibold uppercase tracking-[0.14em] text-fail">Why the train settled back (recorded)</p>
          <ul className="mt-2 list-disc space-y-1 pl-5 text-[13.5px]">
            {settle.sentences.map((s, k) => (
              <li key={k}>{s}</li>
            ))}
          </ul>
        </aside>
      )}
      <RecordingView
        recordingId={rec.recording.id}
        runs={runOptions}
        scenarios={scenarios.map((s) => ({ id: s.id, name: s.name }))}
        canCalibrate={can(user.role, "run:start")}
        canSave={can(user.role, "calibration:save")}
        liftVersion={lift?.version ?? 0}
        lengthUnit={user.units === "us" ? "in" : "mm"}
        units={user.units}
      />
    </>
  );
}
