/**
 * Copies a finished run's figures into its study case and keeps the study's counters and status in
 * step. Called by whoever finished the run (the pool driver, a queue worker) and again when a study is
 * read, so a missed call only delays the table, never loses a case.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Scenario as EngineScenario } from "@/sim/schema";
import { isFinished } from "@/lib/runs/status";
import { headlineOf, judgeCase } from "./headline";

/** Updates the case from its run if the run has finished; true when the case is final afterwards. */
export async function settleCase(caseId: number): Promise<boolean> {
  const { StudyCase, Run, Study } = getModels();
  const c = await StudyCase.findByPk(caseId);
  if (!c || !c.runId) return false;
  if (c.status === "done" || c.status === "failed" || c.status === "cancelled") return true;
  const run = await Run.findByPk(c.runId);
  if (!run) {
    await StudyCase.update({ status: "failed", error: "The case's run was deleted.", finishedAt: new Date() }, { where: { id: c.id } });
  } else if (!isFinished(run.status)) {
    if (run.status === "running" && c.status === "queued") await StudyCase.update({ status: "running" }, { where: { id: c.id, status: "queued" } });
    return false;
  } else if (run.status === "done" && run.summary) {
    const study = await Study.findByPk(c.studyId, { attributes: ["id", "settings"] });
    const requireNoArd = (study?.settings as { requireNoArdCatch?: boolean } | undefined)?.requireNoArdCatch !== false;
    const summary = run.summary as Record<string, unknown>;
    const verdict = judgeCase(run.inputs as unknown as EngineScenario, summary, requireNoArd);
    await StudyCase.update(
      {
        status: "done",
        headline: headlineOf(summary),
        checks: verdict.checks as unknown[],
        acceptable: verdict.acceptable,
        wallTimeMs: run.wallTimeMs,
        error: null,
        finishedAt: run.finishedAt ?? new Date(),
      },
      { where: { id: c.id, status: { [Op.in]: ["queued", "running"] } } },
    );
  } else {
    await StudyCase.update(
      {
        status: run.status === "cancelled" ? "cancelled" : "failed",
        error: run.error ?? (run.status === "cancelled" ? "Cancelled." : "The run failed."),
        wallTimeMs: run.wallTimeMs,
        finishedAt: run.finishedAt ?? new Date(),
      },
      { where: { id: c.id, status: { [Op.in]: ["queued", "running"] } } },
    );
  }
  await refreshStudy(c.studyId);
  return true;
}

/** Recounts a study's cases; a study with nothing left to run becomes done (or failed if no case ran). */
export async function refreshStudy(studyId: number): Promise<void> {
  const { StudyCase, Study } = getModels();
  const rows = (await StudyCase.findAll({
    where: { studyId },
    attributes: ["status", [StudyCase.sequelize!.fn("COUNT", StudyCase.sequelize!.col("id")), "n"]],
    group: ["status"],
    raw: true,
  })) as unknown as { status: string; n: number | bigint }[];
  const count = (s: string) => Number(rows.find((r) => r.status === s)?.n ?? 0);
  const done = count("done");
  const failed = count("failed");
  const open = count("queued") + count("running");
  await Study.update({ casesDone: done, casesFailed: failed }, { where: { id: studyId } });
  if (open === 0) {
    await Study.update(
      { status: done === 0 && failed > 0 ? "failed" : "done", finishedAt: new Date(), version: Study.sequelize!.literal("version + 1") as never },
      { where: { id: studyId, status: { [Op.in]: ["queued", "running"] } } },
    );
  }
}

/** Settles every unfinished case that has a run (reading a study calls this). */
export async function settleOpenCases(studyId: number): Promise<void> {
  const { StudyCase } = getModels();
  const open = await StudyCase.findAll({
    where: { studyId, status: { [Op.in]: ["queued", "running"] }, runId: { [Op.ne]: null } },
    attributes: ["id"],
  });
  for (const c of open) await settleCase(c.id);
}

/** The queue workers' hook: a finished run job of a study case. */
export async function settleCaseOfJob(data: { studyCaseId?: number }): Promise<void> {
  if (data.studyCaseId) await settleCase(data.studyCaseId);
}
