import type { Metadata } from "next";
import { ChangePasswordForm } from "@/components/auth/ChangePasswordForm";
import { ProfileForm } from "@/components/auth/ProfileForm";
import { Card, CardBody, CardHeader } from "@/components/ui/Card";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { ROLE_LABELS } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const user = await pageUser("/settings");
  return (
    <>
      <PageHeader eyebrow="Account" title="Settings" description={`${user.email} · ${ROLE_LABELS[user.role]}`} />
      <div className="grid gap-5 lg:grid-cols-2">
        <Card>
          <CardHeader title="Profile" description="Your name as colleagues see it, and the units you read and type." />
          <CardBody>
            <ProfileForm name={user.name} units={user.units} />
          </CardBody>
        </Card>
        <Card>
          <CardHeader title="Password" description="Enter the current one to choose a new one." />
          <CardBody>
            <ChangePasswordForm />
          </CardBody>
        </Card>
      </div>
    </>
  );
}
