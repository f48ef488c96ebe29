import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createChainSpec, deleteChainSpec, getChainSpec, listChainSpecs, updateChainSpec } from "@/lib/chains/service";
import { createLift } from "@/lib/lifts/service";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };
let other: { organisationId: number; as: Record<Role, Actor> };
const LBF = 4.4482216152605; // N per lbf (exact by definition)

beforeAll(async () => {
  org = await makeOrganisation("chains");
  other = await makeOrganisation("chains-other");
});
afterAll(closeDb);

const ownChain = (overrides: Record<string, unknown> = {}) => ({
  designation: "Lift chain, invented data sheet",
  pitch: 0.1016,
  massPerLength: 15,
  axialStiffness: 1.5e7,
  breakingStrength: 5.0e5,
  source: "Invented manufacturer data sheet (test)",
  note: null,
  ...overrides,
});

describe("standard catalogue (seeded)", () => {
  it("holds ASME B29.1 sizes with pitch n/80 in and minimum tensile strength 12,500·P² lbf", async () => {
    const page = await listChainSpecs(org.as.viewer, { scope: "standard", q: "ASME", pageSize: "100" } as never);
    const byName = new Map(page.items.map((c) => [c.designation, c]));
    // Source: ASME B29.1 via docs/references.md — No. 80: P = 1.000 in, 12,500 lbf = 55.6 kN.
    const no80 = byName.get("ASME B29.1 No. 80")!;
    expect(no80.pitch).toBeCloseTo(0.0254, 10);
    expect(no80.breakingStrength / 1000).toBeCloseTo(55.6, 1);
    // Source: ASME B29.1 via docs/references.md — No. 160: P = 2.000 in, 50,000 lbf.
    expect(byName.get("ASME B29.1 No. 160")!.breakingStrength / LBF).toBeCloseTo(50_000, 6);
    // Source: ASME B29.1 via docs/references.md — No. 240: P = 3.000 in, 112,500 lbf = 500 kN.
    const no240 = byName.get("ASME B29.1 No. 240")!;
    expect(no240.pitch).toBeCloseTo(3 * 0.0254, 10);
    expect(no240.breakingStrength / 1000).toBeCloseTo(500.4, 1);
    for (const c of page.items) {
      expect(c.standard).toBe(true);
      expect(c.source).toMatch(/ASME B29\.1/);
      // Mass per length and E·A have no published table: each row says they are approximate / assumed.
      expect(c.note).toMatch(/approximate/);
      expect(c.note).toMatch(/assumed/);
    }
  });

  it("holds ISO 606 B-series rows whose breaking force is marked as recalled from memory", async () => {
    const page = await listChainSpecs(org.as.viewer, { scope: "standard", q: "ISO 606" });
    expect(page.total).toBe(7);
    // From memory (docs/references.md [memory]): 16B 60 kN … 48B 560 kN.
    const b16 = page.items.find((c) => c.designation === "ISO 606 16B")!;
    expect(b16.breakingStrength).toBe(60_000);
    expect(b16.note).toMatch(/memory/);
  });

  it("is read-only for everyone, admins included", async () => {
    const std = (await listChainSpecs(org.as.admin, { scope: "standard", pageSize: "1" } as never)).items[0];
    const e1 = await expectHttpError(() => updateChainSpec(org.as.admin, std.id, { version: std.version, note: "edited" }), 403);
    expect(e1.message).toMatch(/read-only/);
    await expectHttpError(() => deleteChainSpec(org.as.engineer, std.id), 403);
    expect((await getChainSpec(other.as.viewer, std.id)).id).toBe(std.id); // shared: every organisation reads it
  });
});

describe("organisation's own chains", () => {
  it("create, read, update with version, list in scope own, delete when unused / archive when used", async () => {
    const eng = org.as.engineer;
    const c = await createChainSpec(eng, ownChain());
    expect(c.standard).toBe(false);
    expect((await getChainSpec(org.as.viewer, c.id)).designation).toBe(c.designation);
    const u = await updateChainSpec(eng, c.id, { version: 1, breakingStrength: 5.2e5 });
    expect([u.version, u.breakingStrength]).toEqual([2, 5.2e5]);
    await expectHttpError(() => updateChainSpec(eng, c.id, { version: 1, breakingStrength: 5.3e5 }), 409);
    const own = await listChainSpecs(eng, { scope: "own" });
    expect(own.items.map((x) => x.id)).toContain(c.id);
    expect(own.items.every((x) => !x.standard)).toBe(true);
    expect(await deleteChainSpec(eng, c.id)).toEqual({ id: c.id, outcome: "deleted" });

    const used = await createChainSpec(eng, ownChain({ designation: "Used chain" }));
    await createLift(eng, liftBody({ chain: { chainSpecId: used.id, catchSpacing: 2, catchOffset: 10 } }));
    expect(await deleteChainSpec(eng, used.id)).toEqual({ id: used.id, outcome: "archived" });
    // An archived chain can no longer be chosen for a lift.
    const err = await expectHttpError(() => createLift(eng, liftBody({ chain: { chainSpecId: used.id, catchSpacing: 2 } })), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["chain.chainSpecId"]);
  });

  it("validates with the engine's chain bounds, lists every problem and stores nothing", async () => {
    const before = await designCounts(org.organisationId);
    const err = await expectHttpError(
      () => createChainSpec(org.as.engineer, ownChain({ designation: "", pitch: 2, axialStiffness: -1, source: "" })),
      400,
    );
    expect(err.issues.map((i) => i.path).sort()).toEqual(["axialStiffness", "designation", "pitch", "source"]);
    expect(await designCounts(org.organisationId)).toEqual(before);
  });

  it("hides another organisation's chain (404) and lets only engineers/admins write", async () => {
    const c = await createChainSpec(org.as.admin, ownChain({ designation: "Private chain" }));
    await expectHttpError(() => getChainSpec(other.as.admin, c.id), 404);
    await expectHttpError(() => updateChainSpec(other.as.engineer, c.id, { version: 1, note: "x" }), 404);
    expect((await listChainSpecs(other.as.admin, { q: "Private chain" })).total).toBe(0);
    for (const role of ["reviewer", "operator", "trainer", "viewer"] as const) {
      await expectHttpError(() => createChainSpec(org.as[role], ownChain()), 403);
      await expectHttpError(() => deleteChainSpec(org.as[role], c.id), 403);
    }
  });
});
