import type { Metadata } from "next";
import { LiftTable } from "@/components/lift/LiftTable";
import { ButtonLink } from "@/components/ui/Button";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Lifts" };

export default async function LiftsPage() {
  const user = await pageUser("/lifts");
  return (
    <>
      <PageHeader
        eyebrow="Design"
        title="Lifts"
        description="The chain lifts of your rides. Every save is a new revision; scenarios stay pinned to the revision they were made with."
        actions={can(user.role, "design:write") ? <ButtonLink href="/lifts/new" data-testid="new-lift">New lift</ButtonLink> : undefined}
      />
      <LiftTable />
    </>
  );
}
