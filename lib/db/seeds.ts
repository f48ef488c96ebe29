import type { Sequelize } from "sequelize";
import { demoAccountsSeed } from "@/lib/auth/seed";
import { demoParkChainSeed, standardChainsSeed } from "@/lib/chains/seed";
import { demoReviewCommentSeed } from "@/lib/comments/seed";
import { demoDesignSeed, demoRunsSeed, interruptedRunsSeed } from "@/lib/demo/seed";
import { demoLogbookSeed } from "@/lib/logbook/seed";
import { demoTrainingSeed } from "@/lib/training/seed";
import { demoStudySeed } from "@/lib/studies/seed";

/**
 * One idempotent seed step: running it twice leaves the same rows as running it once. A step runs once per
 * database (recorded in seed_steps), so demo data people edited is never written again; `everyStart` steps
 * (reference data, start-up repairs) run on every start.
 */
export interface SeedStep {
  name: string;
  run: (sequelize: Sequelize) => Promise<void>;
  everyStart?: boolean;
}

// Demo data, in dependency order. To add a step: import it and append it here.
export const seedSteps: SeedStep[] = [
  demoAccountsSeed,
  standardChainsSeed,
  demoDesignSeed,
  demoRunsSeed,
  interruptedRunsSeed,
  demoParkChainSeed,
  demoReviewCommentSeed,
  demoLogbookSeed,
  demoTrainingSeed,
  demoStudySeed,
];
