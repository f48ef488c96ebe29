import type { Metadata } from "next";
import { SavedRunView } from "@/components/run/SavedRunView";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageRow, pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import Link from "next/link";
import { Badge } from "@/components/ui/Badge";
import { RunComments } from "@/components/run/RunComments";
import { getRunHeading } from "@/lib/runs/service";

export const metadata: Metadata = { title: "Run" };

export default async function RunPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await pageUser("/runs/[id]");
  const { id, scenarioId, scenarioName, studyCase } = await pageRow(params, (runId) => getRunHeading(user, runId));
  const sp = await searchParams;
  const t = typeof sp.t === "string" ? Number(sp.t) : undefined;
  return (
    <>
      <PageHeader
        eyebrow={studyCase ? "Study case" : "Saved run"}
        title={`Run ${id}`}
        description={
          <>
            {scenarioName}
            {studyCase && (
              <span className="ml-2" data-testid="run-study-case">
                <Badge tone="caution">study case</Badge>{" "}
                <Link className="font-semibold text-ink-800 hover:underline" href={`/studies/${studyCase.studyId}`}>
                  case {studyCase.index} of {studyCase.studyName}
                </Link>
              </span>
            )}
          </>
        }
      />
      <SavedRunView runId={id} units={user.units} canCancel={can(user.role, "run:cancel")} initialT={t !== undefined && Number.isFinite(t) ? t : undefined} fileStem={`run-${id}`} />
      <RunComments scenarioId={scenarioId} runId={id} userId={user.id} canWrite={can(user.role, "comment:write")} isAdmin={user.role === "admin"} />
    </>
  );
}
