import type { Metadata } from "next";
import Link from "next/link";
import { NewSessionForm } from "@/components/training/NewSessionForm";
import { Badge } from "@/components/ui/Badge";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { listSessions } from "@/lib/training/service";

export const metadata: Metadata = { title: "Replays" };

export default async function ReplaysPage() {
  const user = await pageUser("/replays");
  const manage = can(user.role, "training:manage");
  const sessions = can(user.role, "training:watch") ? await listSessions(user) : [];
  return (
    <>
      <PageHeader eyebrow="Train" title="Replay sessions" description="Saved runs in order, with a trainer's captions at the moments that matter." />
      <div className="space-y-5">
        {manage && (
          <Card>
            <CardHeader title="Build a session" description="Pick saved runs, pin captions to moments, then share it with your organisation." />
            <CardBody>
              <NewSessionForm />
            </CardBody>
          </Card>
        )}
        <Card>
          <CardHeader title={manage ? "Sessions of your organisation" : "Sessions shared with you"} />
          <CardBody>
            {sessions.length === 0 ? (
              <p className="text-[13.5px] text-steel-500">No sessions yet.</p>
            ) : (
              <ul className="divide-y divide-steel-100" data-testid="sessions">
                {sessions.map((s) => (
                  <li key={s.id} className="flex items-center justify-between gap-3 py-2.5">
                    <Link href={`/replays/${s.id}`} className="text-[14px] font-semibold text-ink-900 hover:text-lamp-600">
                      {s.title}
                    </Link>
                    <span className="flex items-center gap-3 text-[13px] text-steel-500">
                      {s.items} run(s)
                      <Badge tone={s.sharedAt ? "pass" : "neutral"}>{s.sharedAt ? "shared" : "draft"}</Badge>
                      {manage && (
                        <Link href={`/replays/${s.id}/edit`} className="font-semibold text-lamp-600 hover:underline">
                          Edit
                        </Link>
                      )}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </CardBody>
        </Card>
      </div>
    </>
  );
}
