import type { Metadata } from "next";
import { ScenarioEditor } from "@/components/scenario/ScenarioEditor";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "New scenario" };

export default async function NewScenarioPage() {
  const user = await pageUser("/scenarios/new");
  return (
    <>
      <PageHeader eyebrow="Design · Scenarios" title="New scenario" />
      <ScenarioEditor scenario={null} units={user.units} canWrite />
    </>
  );
}
