import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { toId } from "@/lib/http/ids";
import { SessionBuilder } from "@/components/training/SessionBuilder";
import { PageHeader } from "@/components/ui/PageHeader";
import { pageUser } from "@/lib/auth/page-guard";
import { HttpError } from "@/lib/http/errors";
import { getSession } from "@/lib/training/service";
import { getModels } from "@/models";

export const metadata: Metadata = { title: "Edit replay session" };

export default async function EditSessionPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("/replays/[id]/edit");
  const id = toId((await params).id);
  if (id === null) notFound();
  let session;
  try {
    session = await getSession(user, id);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const { Run, Scenario } = getModels();
  const runs = await Run.findAll({ where: { organisationId: user.organisationId, status: "done" }, order: [["id", "DESC"]], limit: 100, attributes: ["id", "scenarioId", "inputs"] });
  const scenarios = await Scenario.findAll({ where: { organisationId: user.organisationId }, attributes: ["id", "name"] });
  const options = runs.map((r) => ({
    id: r.id,
    label: `Run ${r.id} · ${scenarios.find((s) => s.id === r.scenarioId)?.name ?? "scenario"}`,
    duration: Number((r.inputs as { run?: { duration?: number } }).run?.duration ?? 0),
  }));
  return (
    <>
      <PageHeader eyebrow="Edit replay session" title={session.title} />
      <SessionBuilder initial={session} runs={options} />
    </>
  );
}
