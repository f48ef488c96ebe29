import type { Metadata } from "next";
import { SessionPlayer } from "@/components/training/SessionPlayer";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { getSession } from "@/lib/training/service";

export const metadata: Metadata = { title: "Replay session" };

export default async function SessionPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/replays/[id]");
  const session = await pageRow(params, (id) => getSession(user, id));
  return (
    <>
      <PageHeader eyebrow="Replay session" title={session.title} description={session.description ?? undefined} />
      <SessionPlayer session={session} units={user.units} />
    </>
  );
}
