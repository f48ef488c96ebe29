import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Scenarios" };

export default async function ScenariosPage() {
  await pageUser("/scenarios");
  return (
    <>
      <PageHeader eyebrow="Design" title="Scenarios" description="Load cases that put a train on a lift and run the chain." />
      <Planned
        audience="Ride engineers write them; operators and trainers start runs; reviewers comment."
        items={[
          "Pick-up of a train by the chain: snatch load in the chain and the dogs.",
          "Stops on the lift: where the train settles back onto the ARD, and how hard.",
          "Take-up movement and counterweight travel during start, run and stop.",
          "Runs queued, running, done, failed or cancelled, with pass / caution / fail checks.",
        ]}
      />
    </>
  );
}
