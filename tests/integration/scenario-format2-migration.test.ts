import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes, type Sequelize } from "sequelize";
import { createSequelize } from "@/lib/db/sequelize";
import { migrateUp } from "@/lib/db/migrate";
import * as m0017 from "@/migrations/0017_scenario_format_2";
import { engineScenarioInput } from "@/lib/scenarios/engine";
import { parseScenario } from "@/sim/schema";
import { createScratchDatabase } from "./db-scratch";

// Migration 0017 on stored rows of format 1 (a scratch database of its own): up converts revisions,
// scenarios and run inputs to format 2 keeping an ideal drive; down writes format 1 back.
let sequelize: Sequelize;
let drop: () => Promise<void>;

const v1Sections = {
  geometry: { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120, bottomRun: 4 },
  chain: { massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5e5, pitch: 0.1016, catchSpacing: 2, catchOffset: 10, guideFriction: 0.02, damping: 2000 },
  drive: { speed: 2.5, rampTime: 2, sprocketTeeth: 11, efficiency: 0.9 },
  takeUp: { mass: 5000, travel: 2.5, position: 1.2, friction: 0 },
  antiRollback: { enabled: true, from: 12, to: 118, toothSpacing: 0.15 },
};
const v1Run = { duration: 20, segments: 24, integrator: "verlet", stepFraction: 0.6, tolerance: 1e-6, contactDamping: 0.1, gravity: 9.80665, airDensity: 1.2 };
const v1Inputs = {
  format: "tautline-scenario/1",
  name: "Stored run",
  lift: v1Sections.geometry,
  chain: v1Sections.chain,
  drive: v1Sections.drive,
  takeUp: v1Sections.takeUp,
  antiRollback: v1Sections.antiRollback,
  train: { cars: 6, carMass: 1300, carLength: 2.6, dogOffset: 1.3, rollingResistance: 0.015, dragArea: 1, entrySpeed: 2.2, startPosition: 14 },
  run: v1Run,
};

const q = <T extends object>(sql: string, replacements: unknown[] = []) => sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
const exec = (sql: string, replacements: unknown[] = []) => sequelize.query(sql, { replacements });
const json = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v) as Record<string, unknown>;
const ids: Record<string, number> = {};

beforeAll(async () => {
  const scratch = await createScratchDatabase("format2");
  drop = scratch.drop;
  sequelize = createSequelize(scratch.config);
  await migrateUp(sequelize);
  // Back to the state before format 2 (columns gone), then rows as format 1 stored them.
  await m0017.down({ context: sequelize.getQueryInterface() });
  const now = new Date();
  await exec("INSERT INTO organisations (name, kind, slug, created_at, updated_at) VALUES ('Migration park', 'operator', 'migration-park', ?, ?)", [now, now]);
  ids.org = (await q<{ id: number }>("SELECT id FROM organisations WHERE slug = 'migration-park'"))[0]!.id;
  await exec("INSERT INTO lifts (organisation_id, name, created_at, updated_at) VALUES (?, 'Old lift', ?, ?)", [ids.org, now, now]);
  ids.lift = (await q<{ id: number }>("SELECT id FROM lifts WHERE organisation_id = ?", [ids.org]))[0]!.id;
  await exec(
    "INSERT INTO lift_revisions (lift_id, number, name, geometry, chain, drive, take_up, anti_rollback, created_at) VALUES (?, 1, 'Old lift', ?, ?, ?, ?, ?, ?)",
    [ids.lift, ...["geometry", "chain", "drive", "takeUp", "antiRollback"].map((k) => JSON.stringify(v1Sections[k as keyof typeof v1Sections])), now],
  );
  ids.revision = (await q<{ id: number }>("SELECT id FROM lift_revisions WHERE lift_id = ?", [ids.lift]))[0]!.id;
  await exec(
    "INSERT INTO trains (organisation_id, name, cars, car_mass_empty, seats_per_car, rider_mass, car_length, dog_offset, rolling_resistance, drag_area, created_at, updated_at) VALUES (?, 'Old train', 6, 1000, 4, 75, 2.6, 1.3, 0.015, 1, ?, ?)",
    [ids.org, now, now],
  );
  ids.train = (await q<{ id: number }>("SELECT id FROM trains WHERE organisation_id = ?", [ids.org]))[0]!.id;
  await exec(
    "INSERT INTO scenarios (organisation_id, name, lift_id, lift_revision_id, train_id, loading, entry_speed, start_position, run_settings, created_at, updated_at) VALUES (?, 'Old scenario', ?, ?, ?, 'full', 2.2, 14, ?, ?, ?)",
    [ids.org, ids.lift, ids.revision, ids.train, JSON.stringify(v1Run), now, now],
  );
  ids.scenario = (await q<{ id: number }>("SELECT id FROM scenarios WHERE organisation_id = ?", [ids.org]))[0]!.id;
  await exec(
    "INSERT INTO runs (organisation_id, scenario_id, lift_revision_id, status, inputs, solver, queued_at, created_at, updated_at) VALUES (?, ?, ?, 'done', ?, '{}', ?, ?, ?)",
    [ids.org, ids.scenario, ids.revision, JSON.stringify(v1Inputs), now, now, now],
  );
});

afterAll(async () => {
  await sequelize?.close();
  await drop?.();
});

describe("migration 0017 (scenario format 2)", () => {
  it("up: stored format 1 data becomes format 2 and keeps an ideal drive", async () => {
    await m0017.up({ context: sequelize.getQueryInterface() });
    const rev = (await q<Record<string, unknown>>("SELECT * FROM lift_revisions WHERE id = ?", [ids.revision]))[0]!;
    expect(json(rev.drive).motor).toEqual({ kind: "ideal" });
    const run = (await q<{ inputs: unknown }>("SELECT inputs FROM runs WHERE scenario_id = ?", [ids.scenario]))[0]!;
    const inputs = json(run.inputs);
    expect(inputs.format).toBe("tautline-scenario/2");
    expect(inputs.train).toBeUndefined();
    expect(inputs.trains).toEqual([expect.objectContaining({ carMass: 1300, entrySpeed: 2.2, startPosition: 14 })]);
    expect(parseScenario(inputs).ok).toBe(true);

    // The stored scenario assembles into a valid format 2 scenario with the revision's ideal drive.
    const s = (await q<Record<string, unknown>>("SELECT * FROM scenarios WHERE id = ?", [ids.scenario]))[0]!;
    const t = (await q<Record<string, unknown>>("SELECT * FROM trains WHERE id = ?", [ids.train]))[0]!;
    const assembled = engineScenarioInput(
      { name: "Old scenario", notes: null, loading: "full", riderCount: null, entrySpeed: 2.2, startPosition: 14, startTime: Number(s.start_time), runSettings: json(s.run_settings), dynamics: s.dynamics ? json(s.dynamics) : null },
      { geometry: json(rev.geometry), chain: json(rev.chain), drive: json(rev.drive), takeUp: json(rev.take_up), antiRollback: json(rev.anti_rollback), limits: null },
      { cars: 6, carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75, carLength: 2.6, dogOffset: 1.3, rollingResistance: 0.015, dragArea: 1, pawls: null },
    );
    const parsed = parseScenario(assembled);
    expect(parsed.ok, JSON.stringify(parsed)).toBe(true);
    if (parsed.ok) {
      expect(parsed.scenario.drive.motor).toEqual({ kind: "ideal" });
      expect(parsed.scenario.trains[0]).toMatchObject({ carMass: 1300, startTime: 0 });
    }
    expect(t.pawls).toBeNull();
  });

  it("down: format 1 written back (train, no motor), and up again gives the same format 2 rows", async () => {
    const upInputs = json((await q<{ inputs: unknown }>("SELECT inputs FROM runs WHERE scenario_id = ?", [ids.scenario]))[0]!.inputs);
    await m0017.down({ context: sequelize.getQueryInterface() });
    const inputs = json((await q<{ inputs: unknown }>("SELECT inputs FROM runs WHERE scenario_id = ?", [ids.scenario]))[0]!.inputs);
    expect(inputs.format).toBe("tautline-scenario/1");
    expect(inputs.train).toMatchObject(v1Inputs.train);
    expect(inputs.trains).toBeUndefined();
    const rev = (await q<Record<string, unknown>>("SELECT drive FROM lift_revisions WHERE id = ?", [ids.revision]))[0]!;
    expect(json(rev.drive)).toEqual(v1Sections.drive);
    const cols = await q<{ COLUMN_NAME: string }>("SELECT COLUMN_NAME FROM information_schema.columns WHERE table_schema = DATABASE() AND table_name = 'scenarios'");
    expect(cols.map((c) => c.COLUMN_NAME)).not.toContain("dynamics");

    await m0017.up({ context: sequelize.getQueryInterface() });
    const again = json((await q<{ inputs: unknown }>("SELECT inputs FROM runs WHERE scenario_id = ?", [ids.scenario]))[0]!.inputs);
    expect(again).toEqual(upInputs);
  });
});
