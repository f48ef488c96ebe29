import type { Sequelize } from "sequelize";
import { seedSteps, type SeedStep } from "./seeds";

/** Runs the seed steps of lib/db/seeds.ts in order. Each step is idempotent, so this may run on every start. */
export async function runSeeds(
  sequelize: Sequelize,
  log: (message: string) => void = () => {},
  steps: SeedStep[] = seedSteps,
): Promise<string[]> {
  const names: string[] = [];
  for (const step of steps) {
    try {
      await step.run(sequelize);
    } catch (err) {
      const reason = err instanceof Error ? err.message : String(err);
      throw new Error(`Seed step "${step.name}" failed: ${reason}`, { cause: err });
    }
    log(`seed: ${step.name}`);
    names.push(step.name);
  }
  return names;
}
