import type { Metadata } from "next";
import Link from "next/link";
import { LiftEditor } from "@/components/lift/LiftEditor";
import { RevisionHistory } from "@/components/lift/RevisionHistory";
import { NEW_LIFT, type LiftJson } from "@/components/lift/types";
import { Badge } from "@/components/ui/Badge";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getLift } from "@/lib/lifts/service";
import { toJson } from "@/lib/client/jsonify";

export const metadata: Metadata = { title: "Lift" };

export default async function LiftPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/lifts/[id]");
  const lift: LiftJson = await pageRow(params, (id) => getLift(user, id).then(toJson));
  const canWrite = can(user.role, "design:write") && !lift.archivedAt;
  return (
    <>
      <PageHeader
        eyebrow="Design · Lifts"
        title={lift.name}
        description={
          <>
            {lift.site ?? "No site given"} · revision {lift.currentRevision.number} · version {lift.version}{" "}
            {lift.archivedAt && <Badge tone="neutral">Archived</Badge>} ·{" "}
            <Link className="underline" href={`/scenarios?liftId=${lift.id}`}>
              scenarios of this lift
            </Link>
          </>
        }
      />
      <div className="space-y-5">
        <LiftEditor mode={{ kind: "edit", lift }} template={NEW_LIFT} units={user.units} canWrite={canWrite} />
        <RevisionHistory liftId={lift.id} units={user.units} />
      </div>
    </>
  );
}
