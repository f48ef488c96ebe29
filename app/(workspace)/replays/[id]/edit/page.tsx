import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { SessionBuilder } from "@/components/training/SessionBuilder";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { HttpError } from "@/lib/http/errors";
import { getSession } from "@/lib/training/service";
import { runPickerOptions } from "@/lib/runs/picker";

export const metadata: Metadata = { title: "Edit replay session" };

export default async function EditSessionPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/replays/[id]/edit");
  const id = toId((await params).id);
  if (id === null) notFound();
  let session;
  try {
    session = await getSession(user, id);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const options = await runPickerOptions(user, { units: user.units });
  return (
    <>
      <PageHeader eyebrow="Edit replay session" title={session.title} />
      <SessionBuilder initial={session} runs={options} units={user.units} />
    </>
  );
}
