import { QueryTypes, type Sequelize } from "sequelize";
import { seedSteps, type SeedStep } from "./seeds";

/**
 * Runs the seed steps of lib/db/seeds.ts in order, each once per database (seed_steps, migration 0045)
 * unless it is marked `everyStart`; so this may run on every start without writing demo data again over
 * edits. Returns the names of the steps that ran.
 */
export async function runSeeds(
  sequelize: Sequelize,
  log: (message: string) => void = () => {},
  steps: SeedStep[] = seedSteps,
): Promise<string[]> {
  const done = new Set(
    (await sequelize.query<{ name: string }>("SELECT name FROM seed_steps", { type: QueryTypes.SELECT })).map((r) => r.name),
  );
  const names: string[] = [];
  for (const step of steps) {
    if (!step.everyStart && done.has(step.name)) continue;
    try {
      await step.run(sequelize);
    } catch (err) {
      const reason = err instanceof Error ? err.message : String(err);
      throw new Error(`Seed step "${step.name}" failed: ${reason}`, { cause: err });
    }
    if (!step.everyStart) {
      await sequelize.query("INSERT IGNORE INTO seed_steps (name, done_at) VALUES (?, ?)", { replacements: [step.name, new Date()] });
    }
    log(`seed: ${step.name}`);
    names.push(step.name);
  }
  return names;
}
