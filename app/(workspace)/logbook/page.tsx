import type { Metadata } from "next";
import { LogbookView } from "@/components/logbook/LogbookView";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { liftChoices } from "@/lib/lifts/service";

export const metadata: Metadata = { title: "Logbook" };

export default async function LogbookPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/logbook");
  const lifts = await liftChoices(user);
  const sp = await searchParams;
  const asked = Number(sp.lift);
  const liftId = lifts.find((l) => l.id === asked)?.id ?? lifts[0]?.id;
  return (
    <>
      <PageHeader eyebrow="Operate" title="Logbook" description="What maintenance measured on the lift: chain elongation, take-up at rest, links removed, lubrication and inspections." />
      {liftId ? (
        <LogbookView
          key={liftId}
          lifts={lifts}
          liftId={liftId}
          units={user.units}
          canWrite={can(user.role, "logbook:write")}
          canSettings={can(user.role, "logbook:settings")}
          canUpload={can(user.role, "recording:upload")}
          canRun={can(user.role, "run:start")}
        />
      ) : (
        <p className="text-[14px] text-steel-500">No lifts yet: an engineer adds them under Lifts.</p>
      )}
    </>
  );
}
