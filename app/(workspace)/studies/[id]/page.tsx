import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { PageHeader } from "@/components/ui/PageHeader";
import { StudyDetail } from "@/components/study/StudyDetail";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { getModels } from "@/models";

export const metadata: Metadata = { title: "Study" };
export const dynamic = "force-dynamic";

export default async function StudyPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/studies/[id]");
  const id = toId((await params).id);
  if (id === null) notFound();
  const study = await getModels().Study.findByPk(id, { attributes: ["id", "organisationId", "name"] });
  if (!study || study.organisationId !== user.organisationId) notFound();
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
