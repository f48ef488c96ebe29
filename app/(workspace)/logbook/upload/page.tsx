import type { Metadata } from "next";
import { UploadWizard } from "@/components/recording/UploadWizard";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { liftChoices } from "@/lib/lifts/service";

export const metadata: Metadata = { title: "Upload a logger recording" };

export default async function UploadPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/logbook/upload");
  const lifts = await liftChoices(user);
  const asked = Number((await searchParams).lift);
  const liftId = lifts.find((l) => l.id === asked)?.id ?? lifts[0]?.id;
  return (
    <>
      <PageHeader eyebrow="Operate" title="Upload a logger recording" description="A dispatch as the data logger saw it, attached to the lift's current revision." />
      {liftId ? <UploadWizard lifts={lifts} liftId={liftId} units={user.units} /> : <p className="text-[14px] text-steel-500">No lifts yet.</p>}
    </>
  );
}
