import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { ReportDetail } from "@/components/report/ReportDetail";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { HttpError } from "@/lib/http/errors";
import { findOwnReport } from "@/lib/reports/service";

export const metadata: Metadata = { title: "Design-check report" };

export default async function ReportPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/reports/[id]");
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  let title = "";
  try {
    title = (await findOwnReport(user, id)).title;
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  return (
    <>
      <PageHeader eyebrow="Design-check report" title={title} />
      <ReportDetail reportId={id} userId={user.id} canWrite={can(user.role, "report:write")} canReview={can(user.role, "report:review")} />
    </>
  );
}
