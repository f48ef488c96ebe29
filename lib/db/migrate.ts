import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";
import { migrations as registered, type Migration } from "../../migrations";

/** The table where umzug records which migrations ran. */
export const MIGRATIONS_TABLE = "schema_migrations";

export type MigrationLog = (message: string) => void;

/** Names must be unique and listed in order (NNNN_ prefixes ascending), or up/down would misbehave. */
export function checkMigrationList(list: Migration[]): void {
  const seen = new Set<string>();
  let previous = "";
  for (const m of list) {
    if (seen.has(m.name)) throw new Error(`Migration "${m.name}" is listed twice in migrations/index.ts.`);
    if (m.name < previous) throw new Error(`Migration "${m.name}" is listed after "${previous}": keep migrations/index.ts in order.`);
    seen.add(m.name);
    previous = m.name;
  }
}

export function createMigrator(sequelize: Sequelize, log: MigrationLog = () => {}, list: Migration[] = registered) {
  checkMigrationList(list);
  const say = (verb: string) => (msg: Record<string, unknown>) => {
    if (msg.event && msg.name) log(`${verb}: ${String(msg.event)} ${String(msg.name)}`);
  };
  return new Umzug<QueryInterface>({
    migrations: list.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up({ context }),
      down: ({ context }) => m.down({ context }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: MIGRATIONS_TABLE }),
    logger: { info: say("migration"), warn: say("migration warning"), error: say("migration error"), debug: () => {} },
  });
}

/** Applies every pending migration; returns the names applied. */
export async function migrateUp(sequelize: Sequelize, log?: MigrationLog): Promise<string[]> {
  const done = await createMigrator(sequelize, log).up();
  return done.map((m) => m.name);
}

/** Reverts the last migration, or all of them with `{ to: 0 }`, or down to (and including) a named one. */
export async function migrateDown(
  sequelize: Sequelize,
  opts: { to?: 0 | string } = {},
  log?: MigrationLog,
): Promise<string[]> {
  const migrator = createMigrator(sequelize, log);
  const done = opts.to === undefined ? await migrator.down() : await migrator.down({ to: opts.to });
  return done.map((m) => m.name);
}

export interface MigrationStatus {
  executed: string[];
  pending: string[];
}

export async function migrationStatus(sequelize: Sequelize): Promise<MigrationStatus> {
  const migrator = createMigrator(sequelize);
  const [executed, pending] = await Promise.all([migrator.executed(), migrator.pending()]);
  return { executed: executed.map((m) => m.name), pending: pending.map((m) => m.name) };
}
