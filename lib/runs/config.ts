/** Run settings from the environment. */
export interface RunConfig {
  /** Largest stored result blob (RUN_RESULT_MAX_BYTES, default 8 MiB; keep it below MariaDB's max_allowed_packet). */
  resultMaxBytes: number;
  /** Wall-time budget of a run unless the request asks for less or more (RUN_BUDGET_SECONDS, default 120 s). */
  defaultBudgetSeconds: number;
  /** Progress is written to the database at most this often (ms). */
  progressWriteMs: number;
  /** Extra time the job runner grants past the engine's own budget before it stops the thread itself. */
  budgetGraceMs: number;
}

const MIB = 1024 * 1024;

function positive(value: string | undefined, fallback: number): number {
  const n = Number(value);
  return Number.isFinite(n) && n > 0 ? n : fallback;
}

export function runConfig(env: NodeJS.ProcessEnv = process.env): RunConfig {
  return {
    resultMaxBytes: Math.floor(positive(env.RUN_RESULT_MAX_BYTES, 8 * MIB)),
    defaultBudgetSeconds: positive(env.RUN_BUDGET_SECONDS, 120),
    progressWriteMs: 500,
    budgetGraceMs: 10_000,
  };
}
