import { DataTypes, QueryTypes, type QueryInterface } from "sequelize";

/**
 * Which seed steps have run on this database (lib/db/seed.ts). Demo data is written once: a restart no
 * longer runs a step again over data people have since edited (a reworded demo comment came back beside
 * the edited one). A database that already holds the demo park (organisation "lanternfell") was seeded
 * before this table existed: the demo steps of that time are recorded as done.
 */
const STEPS_BEFORE_THIS_TABLE = [
  "demo organisations and accounts",
  "demo park: lifts, trains, scenarios",
  "demo park: finished runs",
  "demo park: own chain catalogue entry",
  "demo park: a review comment",
  "demo park: logbook, photo and a logger recording",
  "demo park: a shared replay session",
  "demo park: a finished study and a draft report",
];

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("seed_steps", {
    name: { type: DataTypes.STRING(200), allowNull: false, primaryKey: true },
    done_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  const [row] = await q.sequelize.query<{ n: number | bigint }>("SELECT COUNT(*) AS n FROM organisations WHERE slug = 'lanternfell'", {
    type: QueryTypes.SELECT,
  });
  if (Number(row?.n ?? 0) > 0) {
    const now = new Date();
    await q.bulkInsert("seed_steps", STEPS_BEFORE_THIS_TABLE.map((name) => ({ name, done_at: now })));
  }
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("seed_steps");
}
