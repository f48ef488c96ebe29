/**
 * The dashboard's recent runs: the organisation's newest runs of its scenarios that are not a study's cases
 * (those are listed with their study), each with its headline figures and the design checks it failed
 * (the engine's evaluateChecks on the run's stored inputs and summary).
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import { assertCan, type Actor } from "@/lib/http/actor";
import { designStatics, evaluateChecks, type Check, type Scenario, type Summary } from "@/sim";
import { json } from "./serialize";
import { STUDY_RUN_IDS } from "./service";
import type { RunStatus } from "./status";

/** How many runs the dashboard card lists. */
export const RECENT_RUNS_LIMIT = 8;

/** One line of the recent runs card (plain data, SI). */
export interface RecentRun {
  id: number;
  scenarioId: number;
  scenarioName: string | null;
  status: RunStatus;
  /** When it finished, or was queued when it has not finished. */
  at: Date;
  /** Headline figures of the stored summary; null before the run has one. */
  headline: Pick<Summary, "peakTension" | "minSafetyFactor" | "ardCatches" | "takeUpMaxDrop"> | null;
  /** The checks a finished run failed (key and label). */
  failedChecks: Pick<Check, "key" | "label">[];
  /** A what-if run varied the scenario's entry speed, chain speed or take-up mass. */
  whatIf: boolean;
}

// The checks of a finished run never change (its inputs and summary are frozen), and working them out means
// the design statics of the whole lift: remember them per run version instead of on every dashboard view.
const failedChecksCache = new Map<string, Pick<Check, "key" | "label">[]>();
const CACHE_SIZE = 1_000;

/** The checks a stored run fails; none when its inputs no longer give the statics. */
export function failedChecksOf(inputs: Scenario, summary: Summary): Pick<Check, "key" | "label">[] {
  try {
    return evaluateChecks(summary, designStatics(inputs), inputs.limits)
      .filter((c) => c.state === "fail")
      .map((c) => ({ key: c.key, label: c.label }));
  } catch {
    return [];
  }
}

function cachedFailedChecks(key: string, inputs: () => Scenario, summary: Summary): Pick<Check, "key" | "label">[] {
  let hit = failedChecksCache.get(key);
  if (!hit) {
    hit = failedChecksOf(inputs(), summary);
    if (failedChecksCache.size >= CACHE_SIZE) failedChecksCache.delete(failedChecksCache.keys().next().value!);
    failedChecksCache.set(key, hit);
  }
  return hit;
}

/** The organisation's newest scenario runs that are not study cases, newest first. */
export async function recentRuns(actor: Actor, opts: { limit?: number } = {}): Promise<RecentRun[]> {
  assertCan(actor, "run:read");
  const { Run, Scenario: ScenarioModel } = getModels();
  const runs = await Run.findAll({
    where: { organisationId: actor.organisationId, id: { [Op.notIn]: Run.sequelize!.literal(STUDY_RUN_IDS) } },
    attributes: { exclude: ["result"] },
    order: [["id", "DESC"]],
    limit: opts.limit ?? RECENT_RUNS_LIMIT,
  });
  const scenarioIds = [...new Set(runs.map((r) => r.scenarioId))];
  const names = new Map(
    (scenarioIds.length
      ? await ScenarioModel.findAll({ where: { organisationId: actor.organisationId, id: scenarioIds }, attributes: ["id", "name"] })
      : []
    ).map((s) => [s.id, s.name]),
  );
  return runs.map((r) => {
    const summary = json<Summary | null>(r.summary ?? null);
    return {
      id: r.id,
      scenarioId: r.scenarioId,
      scenarioName: names.get(r.scenarioId) ?? null,
      status: r.status as RunStatus,
      at: r.finishedAt ?? r.queuedAt,
      headline: summary
        ? { peakTension: summary.peakTension, minSafetyFactor: summary.minSafetyFactor, ardCatches: summary.ardCatches, takeUpMaxDrop: summary.takeUpMaxDrop }
        : null,
      failedChecks: summary && r.status === "done" ? cachedFailedChecks(`${r.id}:${r.version}`, () => json<Scenario>(r.inputs), summary) : [],
      whatIf: json<Record<string, number> | null>(r.overrides ?? null) !== null,
    };
  });
}
