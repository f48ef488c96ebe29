import type { Metadata } from "next";
import { TrainEditor, type TrainJson } from "@/components/train/TrainEditor";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getTrain } from "@/lib/trains/service";
import { toJson } from "@/lib/client/jsonify";

export const metadata: Metadata = { title: "Train" };

export default async function TrainPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/trains/[id]");
  const train: TrainJson = await pageRow(params, (id) => getTrain(user, id).then(toJson));
  return (
    <>
      <PageHeader eyebrow="Design · Trains" title={train.name} description={`${train.cars} cars · version ${train.version}${train.archivedAt ? " · archived" : ""}`} />
      <TrainEditor train={train} units={user.units} canWrite={can(user.role, "design:write") && !train.archivedAt} />
    </>
  );
}
