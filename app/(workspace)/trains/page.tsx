import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Trains" };

export default async function TrainsPage() {
  await pageUser("/trains");
  return (
    <>
      <PageHeader eyebrow="Design" title="Trains" description="The trains that ride the lift, car by car." />
      <Planned
        audience="For ride engineers; everyone in the organisation can read."
        items={[
          "Cars with empty and loaded masses, coupling and wheelbase.",
          "Chain dogs: which cars carry them and where they engage the chain.",
          "Anti-rollback dogs and their spacing against the ARD rack.",
          "Passenger loading cases from empty to full.",
        ]}
      />
    </>
  );
}
