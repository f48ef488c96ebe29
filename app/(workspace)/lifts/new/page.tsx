import type { Metadata } from "next";
import { LiftEditor } from "@/components/lift/LiftEditor";
import { NEW_LIFT } from "@/components/lift/types";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "New lift" };

export default async function NewLiftPage() {
  const user = await pageUser("/lifts/new");
  return (
    <>
      <PageHeader eyebrow="Design · Lifts" title="New lift" description="Start from an example lift hill and change what differs. Values are stored in SI; you type them in your own units." />
      <LiftEditor mode={{ kind: "new" }} template={NEW_LIFT} units={user.units} canWrite />
    </>
  );
}
