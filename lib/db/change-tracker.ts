import { AsyncLocalStorage } from "node:async_hooks";
import type { Sequelize } from "sequelize";

/**
 * Per-table change counters for this process, so that answers computed from the database can be reused
 * until one of the tables they read is written (lib/http/read-cache.ts).
 *
 * Every write in the app goes through Sequelize models (no raw SQL writes), so model hooks see them all.
 * A write inside a transaction counts twice: when it is issued and again when the transaction commits,
 * because a reader between the two still sees the old rows and must not keep them.
 */
const generations = new Map<string, number>();
let tick = 0;

function bump(table: string): void {
  generations.set(table, ++tick);
}

/** A stamp of the tables' current counters: equal stamps mean none of them was written in between. */
export function stampOf(tables: Iterable<string>): string {
  return [...tables]
    .sort()
    .map((t) => `${t}:${generations.get(t) ?? 0}`)
    .join(",");
}

/** The counter of the latest write seen by this process. */
export function currentTick(): number {
  return tick;
}

/** Whether any of the tables was written after `since` (a value of currentTick()). */
export function writtenSince(tables: Iterable<string>, since: number): boolean {
  for (const t of tables) if ((generations.get(t) ?? 0) > since) return true;
  return false;
}

let databaseLost = false;

/** A query failed for want of a connection: caches stand aside until the database answers again. */
export function noteDatabaseLost(): void {
  databaseLost = true;
}

/** A query just succeeded. */
export function noteDatabaseAnswered(): void {
  databaseLost = false;
}

/** Whether cached answers may be served (not while the database seems to be away). */
export function cachesUsable(): boolean {
  return !databaseLost;
}

const reads = new AsyncLocalStorage<Set<string>>();

/** Runs `fn` and tells which tables its Sequelize queries read (the main model and every include). */
export async function withReadTracking<T>(fn: () => Promise<T>): Promise<{ value: T; tables: Set<string> }> {
  const tables = new Set<string>();
  const value = await reads.run(tables, fn);
  return { value, tables };
}

interface ModelLike {
  tableName?: string;
  getTableName?: () => unknown;
}

function tableOf(model: ModelLike | undefined): string | null {
  if (!model) return null;
  if (typeof model.tableName === "string") return model.tableName;
  const t = model.getTableName?.();
  return typeof t === "string" ? t : t && typeof t === "object" && "tableName" in t ? String((t as { tableName: unknown }).tableName) : null;
}

interface IncludeLike {
  model?: ModelLike;
  include?: IncludeLike[];
  through?: { model?: ModelLike };
}

function noteIncludes(into: Set<string>, include: IncludeLike[] | undefined): void {
  for (const inc of include ?? []) {
    const t = tableOf(inc.model);
    if (t) into.add(t);
    const through = tableOf(inc.through?.model);
    if (through) into.add(through);
    noteIncludes(into, inc.include);
  }
}

const WRITE_HOOKS = [
  "afterCreate",
  "afterUpdate",
  "afterSave",
  "afterDestroy",
  "afterRestore",
  "afterUpsert",
  "afterBulkCreate",
  "afterBulkUpdate",
  "afterBulkDestroy",
  "afterBulkRestore",
] as const;

const installed = new WeakSet<Sequelize>();

type HookOptions = { transaction?: { afterCommit(fn: () => void): void } | null; model?: ModelLike; include?: IncludeLike[] };

/** Installs the counting hooks on the app's Sequelize instance (once). */
export function trackChanges(sequelize: Sequelize): void {
  if (installed.has(sequelize)) return;
  installed.add(sequelize);
  for (const hook of WRITE_HOOKS) {
    sequelize.addHook(hook as never, function (this: ModelLike, ...args: unknown[]) {
      // Instance hooks get (instance, options), bulk hooks (options); `this` is the model either way.
      const options = (args.length > 1 ? args[1] : args[0]) as HookOptions | undefined;
      const table = tableOf(this) ?? tableOf(options?.model);
      if (!table) return;
      bump(table);
      options?.transaction?.afterCommit(() => bump(table));
    } as never);
  }
  for (const hook of ["beforeFindAfterExpandIncludeAll", "beforeCount"] as const) {
    sequelize.addHook(hook as never, function (this: ModelLike, options: HookOptions) {
      const into = reads.getStore();
      if (!into) return;
      const t = tableOf(this);
      if (t) into.add(t);
      noteIncludes(into, options?.include);
    } as never);
  }
}
