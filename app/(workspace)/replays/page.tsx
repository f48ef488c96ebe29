import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Replays" };

export default async function ReplaysPage() {
  await pageUser("/replays");
  return (
    <>
      <PageHeader eyebrow="Train" title="Replays" description="Watch a run on the lift hill, step by step, with notes." />
      <Planned
        audience="For trainers and the people they train; every role can watch."
        items={[
          "The train, chain and take-up drawn on the lift hill, played at any speed.",
          "Scrub to the moment of pick-up or of a stop, and see the chain tension along the hill.",
          "Trainer notes pinned to moments in the run.",
          "A link to share a replay inside your organisation.",
        ]}
      />
    </>
  );
}
