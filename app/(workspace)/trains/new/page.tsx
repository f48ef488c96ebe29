import type { Metadata } from "next";
import { TrainEditor } from "@/components/train/TrainEditor";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "New train" };

export default async function NewTrainPage() {
  const user = await pageUser("/trains/new");
  return (
    <>
      <PageHeader eyebrow="Design · Trains" title="New train" />
      <TrainEditor train={null} units={user.units} canWrite />
    </>
  );
}
