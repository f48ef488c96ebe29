import type { Metadata } from "next";
import { toId } from "@/lib/http/ids";
import { ScenarioTable } from "@/components/scenario/ScenarioTable";
import { ButtonLink } from "@/components/ui/Button";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Scenarios" };

export default async function ScenariosPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/scenarios");
  const sp = await searchParams;
  const liftId = toId(sp.liftId) ?? undefined;
  return (
    <>
      <PageHeader
        eyebrow="Design"
        title="Scenarios"
        description="Load cases that put a train on a lift: each pinned to a lift revision, with its loading, entry speed and run settings. Open one to run it and replay it."
        actions={can(user.role, "design:write") ? <ButtonLink href="/scenarios/new" data-testid="new-scenario">New scenario</ButtonLink> : undefined}
      />
      <ScenarioTable units={user.units} liftId={liftId} />
    </>
  );
}
