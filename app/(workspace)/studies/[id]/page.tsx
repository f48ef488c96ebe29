import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/PageHeader";
import { StudyDetail } from "@/components/study/StudyDetail";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getStudyHeading } from "@/lib/studies/service";

export const metadata: Metadata = { title: "Study" };
export const dynamic = "force-dynamic";

export default async function StudyPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/studies/[id]");
  const study = await pageRow(params, (id) => getStudyHeading(user, id));
  return (
    <>
      <PageHeader eyebrow="Studies" title={study.name} description="Progress, every case, the plots, the acceptable region and the recommended operating window." />
      <StudyDetail
        id={study.id}
        units={user.units}
        userId={user.id}
        canRun={can(user.role, "study:run")}
        canReadReports={can(user.role, "report:read")}
        canWriteReport={can(user.role, "report:write")}
        canReview={can(user.role, "report:review")}
      />
    </>
  );
}
