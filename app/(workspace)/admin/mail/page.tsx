import type { Metadata } from "next";
import { MailList } from "@/components/admin/MailList";
import { Alert } from "@/components/ui/Alert";
import { Card } from "@/components/ui/Card";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { listOrganisationMail, mailFakeUrl, type FakeMessage } from "@/lib/mail/mailbox";

export const metadata: Metadata = { title: "Development mailbox" };
export const dynamic = "force-dynamic";

export default async function MailboxPage() {
  const user = await pageUser("/admin/mail");
  const base = mailFakeUrl();
  let messages: FakeMessage[] = [];
  let problem: string | null = null;
  if (!base) problem = "This instance has no local mail fake (MAIL_FAKE_URL is not set), so there is nothing to show.";
  else messages = await listOrganisationMail(user.organisationId, base).catch(() => ((problem = `The local mail fake at ${base} does not answer.`), []));
  return (
    <>
      <PageHeader
        eyebrow="Organisation · development only"
        title="Development mailbox"
        description="The e-mail this instance sent to your organisation's people and invitees, as the local mail fake kept it; other organisations' mail is not shown. Production instances send through a real provider and have no such page."
      />
      {problem ? (
        <Alert tone="caution" testId="mail-problem">
          {problem}
        </Alert>
      ) : (
        <Card>
          <MailList messages={messages} />
        </Card>
      )}
    </>
  );
}
