import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Logbook" };

export default async function LogbookPage() {
  await pageUser("/logbook");
  return (
    <>
      <PageHeader eyebrow="Operate" title="Logbook" description="What maintenance measured on the lift, over the seasons." />
      <Planned
        audience="For operations and maintenance staff; engineers read it to calibrate the model."
        items={[
          "Chain elongation over a measured length of pitches, entered after each inspection.",
          "Take-up position at rest and counterweight height, with the date and who measured.",
          "Trends against the replacement limit, and the date it is likely to be reached.",
          "Notes on rollbacks onto the ARD and what the train was carrying.",
        ]}
      />
    </>
  );
}
