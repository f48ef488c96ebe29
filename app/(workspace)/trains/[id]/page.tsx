import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { TrainEditor, type TrainJson } from "@/components/train/TrainEditor";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { HttpError } from "@/lib/http/errors";
import { getTrain } from "@/lib/trains/service";
import { toJson } from "@/lib/client/jsonify";

export const metadata: Metadata = { title: "Train" };

export default async function TrainPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/trains/[id]");
  const id = toId((await params).id);
  if (id === null) notFound();
  let train: TrainJson;
  try {
    train = toJson(await getTrain(user, id));
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  return (
    <>
      <PageHeader eyebrow="Design · Trains" title={train.name} description={`${train.cars} cars · version ${train.version}${train.archivedAt ? " · archived" : ""}`} />
      <TrainEditor train={train} units={user.units} canWrite={can(user.role, "design:write") && !train.archivedAt} />
    </>
  );
}
