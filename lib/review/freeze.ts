/**
 * Approval freezes a scenario (scenarios.frozen_at) with its pinned lift revision (revisions are never
 * changed anyway) and its runs: runs of a frozen scenario refuse changes and deletion.
 */
import { getModels } from "@/models";
import { conflict } from "@/lib/http/errors";

export const FROZEN_RUN_MESSAGE =
  "This run belongs to an approved design check: its scenario is frozen, so the run cannot be changed or deleted. Copy the scenario to work on it.";

export async function assertRunNotFrozen(run: { scenarioId: number }): Promise<void> {
  const s = await getModels().Scenario.findByPk(run.scenarioId, { attributes: ["id", "frozenAt"] });
  if (s?.frozenAt) throw conflict(FROZEN_RUN_MESSAGE);
}
