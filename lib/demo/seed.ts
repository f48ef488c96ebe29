import type { Sequelize } from "sequelize";
import { initModels, type Models } from "@/models";
import type { SeedStep } from "@/lib/db/seeds";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { engineScenarioInput } from "@/lib/scenarios/resolve";
import { storedFollowers } from "@/lib/scenarios/followers";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { packEngineResult, type EngineResult } from "@/lib/runs/pack";
import { meshCheck } from "@/lib/runs/mesh-check";
import { RESULT_FORMAT } from "@/lib/runs/result-format";
import { runConfig } from "@/lib/runs/config";
import { recoverInterruptedRuns } from "@/lib/runs/recover";
import { DEMO_LIFTS, DEMO_PARK, DEMO_SCENARIOS, DEMO_TRAINS } from "./park";
import { demoRevisionData, demoScenarioFields, demoTrainData } from "./build";

async function demoPark(m: Models) {
  const org = await m.Organisation.findOne({ where: { slug: DEMO_PARK.slug } });
  if (!org) throw new Error(`The demo park "${DEMO_PARK.slug}" is missing: the accounts seed step must run first.`);
  const engineer = await m.User.findOne({ where: { email: demoAccount("engineer").email } });
  return { organisationId: org.id, engineerId: engineer?.id ?? null };
}

/**
 * The demo park's lifts (with every revision), trains and scenarios. Rows are matched by name within
 * the park and never changed once they exist, so what a demo user edits stays edited.
 */
export async function seedDemoDesign(sequelize: Sequelize): Promise<void> {
  const m = initModels(sequelize);
  const { organisationId, engineerId } = await demoPark(m);
  await sequelize.transaction(async (transaction) => {
    const liftIds = new Map<string, number>();
    for (const def of DEMO_LIFTS) {
      const existing = await m.Lift.findOne({ where: { organisationId, name: def.name }, transaction });
      if (existing) {
        liftIds.set(def.key, existing.id);
        continue;
      }
      const lift = await m.Lift.create(
        { organisationId, name: def.name, site: def.site, notes: def.notes, currentRevisionId: null, archivedAt: null, createdBy: engineerId },
        { transaction },
      );
      let currentId = 0;
      for (let n = 1; n <= def.revisions.length; n++) {
        const d = demoRevisionData(def, n);
        const rev = await m.LiftRevision.create(
          {
            liftId: lift.id,
            number: n,
            name: d.name,
            site: d.site,
            notes: d.notes,
            geometry: d.lift,
            chain: d.chain,
            chainSpecId: null,
            drive: d.drive,
            takeUp: d.takeUp,
            antiRollback: d.antiRollback,
            limits: d.limits,
            changeSummary: def.revisions[n - 1]!.changeSummary,
            createdBy: engineerId,
          },
          { transaction },
        );
        currentId = rev.id;
      }
      await lift.update({ currentRevisionId: currentId, version: def.revisions.length }, { transaction });
      liftIds.set(def.key, lift.id);
    }

    const trainIds = new Map<string, number>();
    for (const def of DEMO_TRAINS) {
      const existing = await m.Train.findOne({ where: { organisationId, name: def.name }, transaction });
      if (existing) {
        trainIds.set(def.key, existing.id);
        continue;
      }
      const row = await m.Train.create(
        { ...demoTrainData(def.key), organisationId, archivedAt: null, createdBy: engineerId },
        { transaction },
      );
      trainIds.set(def.key, row.id);
    }

    for (const def of DEMO_SCENARIOS) {
      if (await m.Scenario.findOne({ where: { organisationId, name: def.name }, transaction })) continue;
      const liftId = liftIds.get(def.lift)!;
      const rev = await m.LiftRevision.findOne({ where: { liftId, number: def.revision }, transaction });
      if (!rev) throw new Error(`Demo lift ${def.lift} has no revision ${def.revision} in the database.`);
      await m.Scenario.create(
        {
          ...demoScenarioFields(def),
          organisationId,
          liftId,
          liftRevisionId: rev.id,
          trainId: trainIds.get(def.train)!,
          followers: def.followers?.length
            ? def.followers.map((f) => ({
                trainId: trainIds.get(f.train)!,
                loading: f.loading,
                riderCount: f.loading === "riders" ? (f.riderCount ?? 0) : null,
                entrySpeed: f.entrySpeed,
                startPosition: f.startPosition,
                startTime: f.startTime,
              }))
            : null,
          archivedAt: null,
          frozenAt: null,
          createdBy: engineerId,
        },
        { transaction },
      );
    }
  });
}

/**
 * One finished run per demo scenario, computed here with the engine (the same packing as the job
 * pool), so a new user sees results at once. A scenario that already has a finished run is skipped.
 */
export async function seedDemoRuns(sequelize: Sequelize): Promise<void> {
  const m = initModels(sequelize);
  const { organisationId, engineerId } = await demoPark(m);
  const cfg = runConfig();
  for (const def of DEMO_SCENARIOS) {
    const scenario = await m.Scenario.findOne({ where: { organisationId, name: def.name } });
    if (!scenario) continue;
    if (await m.Run.findOne({ where: { scenarioId: scenario.id, status: "done" }, attributes: ["id"] })) continue;
    const [revision, train] = await Promise.all([
      m.LiftRevision.findByPk(scenario.liftRevisionId),
      m.Train.findByPk(scenario.trainId),
    ]);
    if (!revision || !train) continue;
    const followerTrains = [];
    for (const f of storedFollowers(scenario.followers)) {
      const t = await m.Train.findByPk(f.trainId);
      if (!t) throw new Error(`Demo scenario "${def.name}" points at a missing following train ${f.trainId}.`);
      followerTrains.push(t);
    }
    const parsed = parseScenario(engineScenarioInput(scenario, revision, train, followerTrains));
    if (!parsed.ok) throw new Error(`Demo scenario "${def.name}" is not a valid engine scenario: ${parsed.issues.map((i) => i.path).join(", ")}`);
    const queuedAt = new Date();
    const t0 = performance.now();
    const result = simulate(parsed.scenario, { budget: { wallTimeMs: cfg.defaultBudgetSeconds * 1000 } });
    const wallTimeMs = Math.round(performance.now() - t0);
    const packed = packEngineResult(result as unknown as EngineResult);
    if (packed.blob.byteLength > cfg.resultMaxBytes) throw new Error(`Demo run "${def.name}" is too large to store.`);
    await m.Run.create({
      organisationId,
      scenarioId: scenario.id,
      liftRevisionId: scenario.liftRevisionId,
      startedBy: engineerId,
      status: "done",
      progress: 1,
      inputs: parsed.scenario as unknown as Record<string, unknown>,
      solver: { budgetSeconds: cfg.defaultBudgetSeconds, run: parsed.scenario.run },
      summary: packed.summary,
      diagnostics: { ...packed.diagnostics, ...meshCheck(parsed.scenario, result.summary) },
      result: Buffer.from(packed.blob),
      resultFormat: RESULT_FORMAT,
      resultBytes: packed.blob.byteLength,
      wallTimeMs,
      runner: null,
      queuedAt,
      startedAt: queuedAt,
      finishedAt: new Date(),
    });
  }
}

export const demoDesignSeed: SeedStep = { name: "demo park: lifts, trains, scenarios", run: seedDemoDesign };
export const demoRunsSeed: SeedStep = { name: "demo park: finished runs", run: seedDemoRuns };
/** Not demo data, but it belongs before every start: runs of a process that is gone are marked failed. */
export const interruptedRunsSeed: SeedStep = {
  name: "runs interrupted by a restart",
  everyStart: true,
  run: async (sequelize) => {
    await recoverInterruptedRuns(initModels(sequelize));
  },
};
