import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Lifts" };

export default async function LiftsPage() {
  await pageUser("/lifts");
  return (
    <>
      <PageHeader eyebrow="Design" title="Lifts" description="The chain lifts of your rides, each with its revisions." />
      <Planned
        audience="For ride engineers; everyone in the organisation can read."
        items={[
          "Lift hill profile: length, angle, transitions at the bottom and top.",
          "Drive sprocket, idler, chain pitch and breaking strength from the chain catalogue.",
          "Take-up: 2:1 weighted gravity take-up, counterweight mass and travel limits.",
          "Anti-rollback device (ARD) spacing and catch points along the hill.",
          "Revisions: every change kept, with who made it and why.",
        ]}
      />
    </>
  );
}
