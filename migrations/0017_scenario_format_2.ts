import { DataTypes, QueryTypes, type QueryInterface } from "sequelize";
import { toFormat1, toFormat2 } from "@/lib/scenarios/format";

/**
 * Scenario format 2 (`tautline-scenario/2`).
 * - New columns: `scenarios.dynamics` (the scenario's drive model and damping over its pinned revision,
 *   NULL = none) and `scenarios.start_time` (s, when the train appears).
 * - Stored JSON is converted by the engine's own version 1 → 2 conversion, so every stored scenario keeps
 *   what it meant (an ideal drive, the version 1 contacts): lift revisions' sections, scenarios' run
 *   settings (contact settings move to `dynamics.contacts`), runs' inputs, studies' base scenario and
 *   calibrations' scenario. Revisions keep their number and content otherwise: this is a change of
 *   format, not an edit.
 * `down` writes version 1 back (fields version 1 does not know are dropped) and removes the columns.
 */

type Row = Record<string, unknown>;
const json = (v: unknown): Row | null => (typeof v === "string" ? (JSON.parse(v) as Row) : ((v as Row | null) ?? null));
const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

async function tableExists(q: QueryInterface, table: string): Promise<boolean> {
  const rows = await q.sequelize.query<{ n: number }>(
    "SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = ?",
    { replacements: [table], type: QueryTypes.SELECT },
  );
  return Number(rows[0]?.n ?? 0) > 0;
}

/** Rewrites one JSON column of every row of `table` with `fn` (rows whose value does not change are left alone). */
async function rewrite(q: QueryInterface, table: string, column: string, fn: (v: Row) => Row): Promise<void> {
  if (!(await tableExists(q, table))) return; // created later by its own migration, already in format 2
  const rows = await q.sequelize.query<{ id: number; v: unknown }>(`SELECT id, \`${column}\` AS v FROM \`${table}\``, { type: QueryTypes.SELECT });
  for (const r of rows) {
    const before = json(r.v);
    if (!before) continue;
    const after = fn(before);
    if (!same(before, after))
      await q.sequelize.query(`UPDATE \`${table}\` SET \`${column}\` = ? WHERE id = ?`, { replacements: [JSON.stringify(after), r.id] });
  }
}

/** A placeholder train and run so one revision's sections make a whole version 1 scenario to convert. */
const PLACEHOLDER = {
  train: { cars: 1, carMass: 1000, carLength: 2, dogOffset: 1, startPosition: 0 },
  run: { duration: 1 },
};

function revisionAsV1(rev: Row, run: Row = PLACEHOLDER.run): Row {
  return {
    format: "tautline-scenario/1",
    name: "revision",
    lift: json(rev.geometry),
    chain: json(rev.chain),
    drive: json(rev.drive),
    takeUp: json(rev.take_up),
    antiRollback: json(rev.anti_rollback),
    train: PLACEHOLDER.train,
    run,
  };
}

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("scenarios", "dynamics", { type: DataTypes.JSON, allowNull: true });
  await q.addColumn("scenarios", "start_time", { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 });

  // Scenarios first, from the revisions as they were (the contact defaults of version 1 depend on the chain).
  const revisions = await q.sequelize.query<Row>("SELECT id, geometry, chain, drive, take_up, anti_rollback FROM lift_revisions", { type: QueryTypes.SELECT });
  const byId = new Map(revisions.map((r) => [Number(r.id), r]));
  const scenarios = await q.sequelize.query<Row>("SELECT id, lift_revision_id, run_settings FROM scenarios", { type: QueryTypes.SELECT });
  for (const s of scenarios) {
    const rev = byId.get(Number(s.lift_revision_id));
    const run = json(s.run_settings) ?? {};
    if (!rev) continue;
    const v2 = toFormat2(revisionAsV1(rev, run)) as Row;
    const contacts = v2.contacts as Row | undefined;
    await q.sequelize.query("UPDATE scenarios SET run_settings = ?, dynamics = ? WHERE id = ?", {
      replacements: [JSON.stringify(v2.run ?? run), contacts ? JSON.stringify({ contacts }) : null, s.id],
    });
  }
  for (const rev of revisions) {
    const v2 = toFormat2(revisionAsV1(rev)) as Row;
    const next = { chain: v2.chain, drive: v2.drive, take_up: v2.takeUp };
    if (same(next, { chain: json(rev.chain), drive: json(rev.drive), take_up: json(rev.take_up) })) continue;
    await q.sequelize.query("UPDATE lift_revisions SET chain = ?, drive = ?, take_up = ? WHERE id = ?", {
      replacements: [JSON.stringify(next.chain), JSON.stringify(next.drive), JSON.stringify(next.take_up), rev.id],
    });
  }

  await rewrite(q, "runs", "inputs", (v) => toFormat2(v) as Row);
  await rewrite(q, "studies", "settings", (v) => (v.base ? { ...v, base: toFormat2(v.base) } : v));
  await rewrite(q, "calibrations", "inputs", (v) => (v.scenario ? { ...v, scenario: toFormat2(v.scenario) } : v));
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await rewrite(q, "calibrations", "inputs", (v) => (v.scenario ? { ...v, scenario: toFormat1(v.scenario) } : v));
  await rewrite(q, "studies", "settings", (v) => (v.base ? { ...v, base: toFormat1(v.base) } : v));
  await rewrite(q, "runs", "inputs", (v) => toFormat1(v) as Row);

  const revisions = await q.sequelize.query<Row>("SELECT id, geometry, chain, drive, take_up, anti_rollback FROM lift_revisions", { type: QueryTypes.SELECT });
  for (const rev of revisions) {
    const asV2 = { ...revisionAsV1(rev), format: "tautline-scenario/2", trains: [PLACEHOLDER.train] };
    delete (asV2 as Row).train;
    const v1 = toFormat1(asV2) as Row;
    await q.sequelize.query("UPDATE lift_revisions SET chain = ?, drive = ?, take_up = ? WHERE id = ?", {
      replacements: [JSON.stringify(v1.chain), JSON.stringify(v1.drive), JSON.stringify(v1.takeUp), rev.id],
    });
  }
  // Contacts set on a scenario go back into its run settings as version 1 had them.
  const scenarios = await q.sequelize.query<Row>("SELECT id, run_settings, dynamics FROM scenarios", { type: QueryTypes.SELECT });
  for (const s of scenarios) {
    const c = (json(s.dynamics)?.contacts ?? null) as Row | null;
    if (!c) continue;
    const run = { ...(json(s.run_settings) ?? {}) };
    if (typeof c.dogStiffness === "number") run.contactStiffness = c.dogStiffness;
    if (typeof c.dampingRatio === "number") run.contactDamping = c.dampingRatio;
    await q.sequelize.query("UPDATE scenarios SET run_settings = ? WHERE id = ?", { replacements: [JSON.stringify(run), s.id] });
  }
  await q.removeColumn("scenarios", "start_time");
  await q.removeColumn("scenarios", "dynamics");
}
