import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { SavedRunView } from "@/components/run/SavedRunView";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { can } from "@/lib/auth/permissions";
import { HttpError } from "@/lib/http/errors";
import { getRun } from "@/lib/runs/service";
import { getModels } from "@/models";

export const metadata: Metadata = { title: "Run" };

export default async function RunPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await pageUser("/runs/[id]");
  const id = toId((await params).id);
  if (id === null) notFound();
  let scenarioName = "";
  try {
    const run = await getRun(user, id);
    scenarioName = (await getModels().Scenario.findByPk(run.scenarioId, { attributes: ["name"] }))?.name ?? "";
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const sp = await searchParams;
  const t = typeof sp.t === "string" ? Number(sp.t) : undefined;
  return (
    <>
      <PageHeader eyebrow="Saved run" title={`Run ${id}`} description={scenarioName} />
      <SavedRunView runId={id} units={user.units} canCancel={can(user.role, "run:cancel")} initialT={t !== undefined && Number.isFinite(t) ? t : undefined} fileStem={`run-${id}`} />
    </>
  );
}
