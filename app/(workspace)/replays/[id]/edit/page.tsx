import type { Metadata } from "next";
import { SessionBuilder } from "@/components/training/SessionBuilder";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { getSession } from "@/lib/training/service";
import { runPickerOptions } from "@/lib/runs/picker";

export const metadata: Metadata = { title: "Edit replay session" };

export default async function EditSessionPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/replays/[id]/edit");
  const session = await pageRow(params, (id) => getSession(user, id));
  const options = await runPickerOptions(user, { units: user.units });
  return (
    <>
      <PageHeader eyebrow="Edit replay session" title={session.title} />
      <SessionBuilder initial={session} runs={options} units={user.units} />
    </>
  );
}
