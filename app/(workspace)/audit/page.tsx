import type { Metadata } from "next";
import { AuditTrail } from "@/components/audit/AuditTrail";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { auditFilterOptions } from "@/lib/audit/list";

export const metadata: Metadata = { title: "Audit trail" };

export default async function AuditPage() {
  const user = await pageUser("/audit");
  const options = await auditFilterOptions(user);
  return (
    <>
      <PageHeader eyebrow="Records" title="Audit trail" description="Every change to lifts, trains, scenarios, runs, reports and comments: who, when, and what changed, field by field." />
      <AuditTrail users={options.users} lifts={options.lifts} />
    </>
  );
}
