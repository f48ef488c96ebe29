import type { Metadata } from "next";
import { InviteForm } from "@/components/admin/InviteForm";
import { UsersTable } from "@/components/admin/UsersTable";
import { ButtonLink } from "@/components/ui/Button";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { PageHeader } from "@/components/ui/PageHeader";
import { listUsers } from "@/lib/auth/accounts";
import { pageUser } from "@/lib/auth/page-guard";
import { isProductionInstance } from "@/lib/auth/secret";

export const metadata: Metadata = { title: "People" };

export default async function AdminUsersPage() {
  const admin = await pageUser("/admin/users");
  const users = await listUsers(admin);
  const devMail = !isProductionInstance();
  return (
    <>
      <PageHeader
        eyebrow="Organisation"
        title="People"
        description="Invite colleagues by e-mail, set what each role may do, and deactivate accounts that should no longer sign in."
        actions={devMail ? <ButtonLink href="/admin/mail" variant="secondary" size="sm">Development mailbox</ButtonLink> : undefined}
      />
      <div className="space-y-5">
        <Card>
          <CardHeader title="Invite someone" description="They get a one-time link to choose a password; it works once, within 72 hours." />
          <CardBody>
            <InviteForm showMailbox={devMail} />
          </CardBody>
        </Card>
        <Card>
          <CardHeader title={`${users.length} people`} description="Role changes and deactivation apply at the person's next request." />
          <UsersTable users={users} meId={admin.id} />
        </Card>
      </div>
    </>
  );
}
