/**
 * What the logbook needs to know about a lift: its current revision's pitch and take-up travel, and the
 * take-up room a hot day needs from the engine's statics (designStatics' travel budget), computed with
 * the lift's newest scenario's train (any train gives the same thermal part; the elastic part is
 * reported when a scenario exists).
 */
import { Op } from "sequelize";
import { designStatics } from "@/sim";
import type { Actor } from "@/lib/http/actor";
import { ownOr404 } from "@/lib/http/actor";
import { resolveEngineScenario } from "@/lib/scenarios/engine";
import { loadFollowerTrains } from "@/lib/scenarios/service";
import { getModels, type Lift, type LiftRevision } from "@/models";

export interface LiftContext {
  lift: Lift;
  revision: LiftRevision;
  pitch: number;
  travel: number;
  /** Take-up room kept for heat (half of α·ΔT·loop length), m. */
  thermalReserve: number;
  /** Counterweight rise when the train loads the chain (from statics), m; null without a scenario. */
  elasticExcursion: number | null;
  staticsSource: string;
}

export async function loadLiftContext(actor: Actor, liftId: number): Promise<LiftContext> {
  const { Lift, LiftRevision, Scenario, Train } = getModels();
  const lift = ownOr404(await Lift.findByPk(liftId), actor, "Lift");
  const revision = await LiftRevision.findByPk(lift.currentRevisionId ?? 0);
  if (!revision) throw new Error(`Lift ${lift.id} has no current revision.`);
  const chain = revision.chain as { pitch: number };
  const takeUp = revision.takeUp as { travel: number };
  const geometry = revision.geometry as { chainFrom: number; chainTo: number; bottomRun?: number };
  const limits = (revision.limits ?? {}) as { thermalDeltaT?: number; thermalExpansion?: number };
  // Fallback without a scenario: the loop is both strands plus the bottom run (as the engine routes it).
  const loop = 2 * (geometry.chainTo - geometry.chainFrom) + (geometry.bottomRun ?? 4);
  let thermalReserve = ((limits.thermalExpansion ?? 11.7e-6) * (limits.thermalDeltaT ?? 40) * loop) / 2;
  let elasticExcursion: number | null = null;
  let staticsSource = "the lift's chain length (no scenario yet for the engine's statics)";
  const scenario = await Scenario.findOne({ where: { liftId: lift.id, archivedAt: { [Op.is]: null } }, order: [["id", "DESC"]] });
  const train = scenario ? await Train.findByPk(scenario.trainId) : null;
  if (scenario && train) {
    const r = resolveEngineScenario(scenario, revision, train, await loadFollowerTrains(scenario));
    if (r.ok) {
      const st = designStatics(r.scenario);
      thermalReserve = st.takeUp.thermal;
      elasticExcursion = st.takeUp.elasticExcursion;
      staticsSource = `the engine's statics with scenario "${scenario.name}"`;
    }
  }
  return { lift, revision, pitch: chain.pitch, travel: takeUp.travel, thermalReserve, elasticExcursion, staticsSource };
}
