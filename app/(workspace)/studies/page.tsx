import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/PageHeader";
import { StudyList } from "@/components/study/StudyList";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Studies" };

export default async function StudiesPage() {
  const user = await pageUser("/studies");
  return (
    <>
      <PageHeader
        eyebrow="Operate"
        title="Studies"
        description="Many runs of one scenario with one or two inputs varied: the window the lift can be operated in, and a design check to sign off."
      />
      <StudyList units={user.units} canRun={can(user.role, "study:run")} />
    </>
  );
}
