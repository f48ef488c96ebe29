import type { Metadata } from "next";
import Link from "next/link";
import { RecordingView } from "@/components/recording/RecordingView";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getRecordingPage } from "@/lib/recordings/service";

export const metadata: Metadata = { title: "Recording" };

export default async function RecordingPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/logbook/recordings/[id]");
  const { recording, lift, scenarios, runs, settleBack } = await pageRow(params, (id) => getRecordingPage(user, id, user.units));
  return (
    <>
      <PageHeader
        eyebrow="Recording"
        title={recording.name}
        description={`${lift?.name ?? ""} · ${recording.sampleCount} samples over ${recording.duration.toFixed(1)} s · channels: ${recording.channels.join(", ")}`}
      />
      <div className="mb-4 flex gap-4 text-[13.5px]">
        <Link className="font-semibold text-lamp-600 hover:underline" href={`/logbook?lift=${recording.liftId}`}>
          Back to the logbook
        </Link>
        {recording.fileUrl && (
          <a className="font-semibold text-lamp-600 hover:underline" href={recording.fileUrl}>
            Download the file as received
          </a>
        )}
      </div>
      {settleBack && (
        <aside className="mb-5 rounded-lg border border-fail/40 bg-white px-4 py-3" data-testid="recorded-settle-back">
          <p className="font-mono text-[10.5px] font-semibold uppercase tracking-[0.14em] text-fail">Why the train settled back (recorded)</p>
          <ul className="mt-2 list-disc space-y-1 pl-5 text-[13.5px]">
            {settleBack.sentences.map((s, k) => (
              <li key={k}>{s}</li>
            ))}
          </ul>
        </aside>
      )}
      <RecordingView
        recordingId={recording.id}
        runs={runs}
        scenarios={scenarios}
        canCalibrate={can(user.role, "run:start")}
        canSave={can(user.role, "calibration:save")}
        liftVersion={lift?.version ?? 0}
        lengthUnit={user.units === "us" ? "in" : "mm"}
        units={user.units}
      />
    </>
  );
}
