import crypto from "node:crypto";
import { getModels } from "@/models";
import { getSequelize } from "@/lib/db/sequelize";
import { ROLES, type Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { HttpError } from "@/lib/http/errors";

/** A fresh organisation with one user per role, unique names so test runs never collide. Seeded rows are left alone. */
export async function makeOrganisation(tag: string): Promise<{ organisationId: number; as: Record<Role, Actor> }> {
  const { Organisation, User } = getModels();
  const suffix = crypto.randomBytes(4).toString("hex");
  const org = await Organisation.create({ name: `Design test ${tag} ${suffix}`, kind: "engineering", slug: `design-${tag}-${suffix}` });
  const as = {} as Record<Role, Actor>;
  for (const role of ROLES) {
    const u = await User.create({
      organisationId: org.id,
      email: `${role}.${tag}.${suffix}@design-test.example`,
      name: `${role} ${tag}`,
      role,
      passwordHash: null,
    });
    as[role] = { id: u.id, organisationId: org.id, role };
  }
  return { organisationId: org.id, as };
}

export async function closeDb(): Promise<void> {
  await getSequelize().close();
}

/**
 * Row counts of the design tables for one organisation (other test files write at the same time), to
 * prove a refused request stored nothing.
 */
export async function designCounts(organisationId: number): Promise<Record<string, number>> {
  const queries: Record<string, string> = {
    chain_specs: "SELECT COUNT(*) AS n FROM chain_specs WHERE organisation_id = ?",
    lifts: "SELECT COUNT(*) AS n FROM lifts WHERE organisation_id = ?",
    lift_revisions: "SELECT COUNT(*) AS n FROM lift_revisions r JOIN lifts l ON l.id = r.lift_id WHERE l.organisation_id = ?",
    trains: "SELECT COUNT(*) AS n FROM trains WHERE organisation_id = ?",
    scenarios: "SELECT COUNT(*) AS n FROM scenarios WHERE organisation_id = ?",
    audit_entries: "SELECT COUNT(*) AS n FROM audit_entries WHERE organisation_id = ?",
    comments: "SELECT COUNT(*) AS n FROM comments WHERE organisation_id = ?",
  };
  const out: Record<string, number> = {};
  for (const [t, sql] of Object.entries(queries)) {
    const [rows] = (await getSequelize().query(sql, { replacements: [organisationId] })) as [{ n: number | bigint }[], unknown];
    out[t] = Number(rows[0].n);
  }
  return out;
}

/** Runs `fn`, expecting an HttpError with `status`; returns it for further checks. */
export async function expectHttpError(fn: () => Promise<unknown>, status: number): Promise<HttpError> {
  try {
    await fn();
  } catch (err) {
    if (err instanceof HttpError && err.status === status) return err;
    throw new Error(`expected HTTP ${status}, got ${err instanceof HttpError ? `${err.status} ${err.message} ${JSON.stringify(err.issues)}` : String(err)}`);
  }
  throw new Error(`expected HTTP ${status}, but the call succeeded`);
}

/** The example lift hill of the scenario format (sim/examples/lift-hill-example.json), as lift sections. */
export function liftBody(overrides: Record<string, unknown> = {}) {
  return {
    name: "Test lift",
    site: "North slope",
    notes: null,
    lift: { approachLength: 15, sagRadius: 30, angle: 40, inclineLength: 50, crestRadius: 25, exitLength: 40, chainFrom: 10, chainTo: 122, dogRelease: 120, bottomRun: 4 },
    chain: { massPerLength: 15, axialStiffness: 1.5e7, breakingStrength: 5.0e5, pitch: 0.1016, catchSpacing: 2, catchOffset: 10, guideFriction: 0.02 },
    drive: { speed: 2.5, rampTime: 2, sprocketTeeth: 11, efficiency: 0.9 },
    takeUp: { mass: 5000, travel: 2.5, position: 1.2, friction: 0 },
    antiRollback: { from: 12, to: 118, toothSpacing: 0.15 },
    ...overrides,
  };
}

export function trainBody(overrides: Record<string, unknown> = {}) {
  return {
    name: "Test train",
    cars: 6,
    carMassEmpty: 1000,
    seatsPerCar: 4,
    riderMass: 75,
    carLength: 2.6,
    dogOffset: 1.3,
    rollingResistance: 0.015,
    dragArea: 1.0,
    ...overrides,
  };
}

export function scenarioBody(liftId: number, trainId: number, overrides: Record<string, unknown> = {}) {
  return {
    name: "Test scenario",
    liftId,
    trainId,
    loading: "full",
    entrySpeed: 2.2,
    startPosition: 14,
    runSettings: { duration: 50, segments: 60 },
    ...overrides,
  };
}
