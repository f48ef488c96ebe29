import type { Metadata } from "next";
import { TrainTable } from "@/components/train/TrainTable";
import { ButtonLink } from "@/components/ui/Button";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Trains" };

export default async function TrainsPage() {
  const user = await pageUser("/trains");
  return (
    <>
      <PageHeader
        eyebrow="Design"
        title="Trains"
        description="The trains that ride the lift: cars, seats, rider mass and where the chain dog sits."
        actions={can(user.role, "design:write") ? <ButtonLink href="/trains/new" data-testid="new-train">New train</ButtonLink> : undefined}
      />
      <TrainTable units={user.units} />
    </>
  );
}
