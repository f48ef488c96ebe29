import type { Metadata } from "next";
import { Planned } from "@/components/shell/Planned";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";

export const metadata: Metadata = { title: "Studies" };

export default async function StudiesPage() {
  await pageUser("/studies");
  return (
    <>
      <PageHeader eyebrow="Operate" title="Studies" description="Many runs of one scenario with one input varied, compared side by side." />
      <Planned
        audience="For ride engineers and reviewers; every role can read the results."
        items={[
          "Sweep an input (train load, chain elongation, counterweight mass, motor torque) over a range.",
          "Peak snatch load and chain safety factor across the sweep, each with its check state.",
          "Take-up travel used against the travel available.",
          "A study report to attach to a design review.",
        ]}
      />
    </>
  );
}
