import type { Metadata } from "next";
import { ReportQueue } from "@/components/report/ReportQueue";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Reviews" };

export default async function ReportsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await pageUser("/reports");
  const sp = await searchParams;
  const asked = typeof sp.status === "string" && ["draft", "submitted", "returned", "approved", ""].includes(sp.status) ? sp.status : null;
  // Reviewers land on what awaits them; authors on every report.
  const initial = asked ?? (can(user.role, "report:review") ? "submitted" : "");
  return (
    <>
      <PageHeader
        eyebrow="Sign-off"
        title="Reviews"
        description="Design-check reports: the ones awaiting review first. Open one to read its approval summary, approve it or return it with a comment."
      />
      <ReportQueue initialStatus={initial} />
    </>
  );
}
