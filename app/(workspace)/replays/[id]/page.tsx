import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { SessionPlayer } from "@/components/training/SessionPlayer";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { HttpError } from "@/lib/http/errors";
import { getSession } from "@/lib/training/service";

export const metadata: Metadata = { title: "Replay session" };

export default async function SessionPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/replays/[id]");
  const id = toId((await params).id);
  if (id === null) notFound();
  let session;
  try {
    session = await getSession(user, id);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  return (
    <>
      <PageHeader eyebrow="Replay session" title={session.title} description={session.description ?? undefined} />
      <SessionPlayer session={session} units={user.units} />
    </>
  );
}
