/** Lifts with a profile (`lift.profile`): stored as given, refused with field paths and units when a join kinks. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createLift, updateLift } from "@/lib/lifts/service";
import type { Role } from "@/lib/auth/roles";
import type { Actor } from "@/lib/http/actor";
import { closeDb, designCounts, expectHttpError, liftBody, makeOrganisation } from "./design-fixtures";

let org: { organisationId: number; as: Record<Role, Actor> };

beforeAll(async () => {
  org = await makeOrganisation("lift-profile");
});
afterAll(closeDb);

/** A two-slope lift: level 10 m, 20° kicker, 45° incline, crest, first drop at −50°. */
const TWO_SLOPE = [
  { kind: "straight", length: 10, angle: 0 },
  { kind: "arc", radius: 30, toAngle: 20 },
  { kind: "straight", length: 25, angle: 20 },
  { kind: "arc", radius: 40, toAngle: 45 },
  { kind: "straight", length: 50, angle: 45 },
  { kind: "arc", radius: 20, toAngle: -50 },
  { kind: "straight", length: 20, angle: -50 },
];
const chainExtent = { chainFrom: 8, chainTo: 110, dogRelease: 108, bottomRun: 4 };

describe("lift profiles through the lift API's schema", () => {
  it("stores a profile without the parametric fields and goes back to the parametric lift with profile null", async () => {
    const eng = org.as.engineer;
    const created = await createLift(eng, liftBody({ name: "Profile lift", lift: { profile: TWO_SLOPE, ...chainExtent }, antiRollback: { from: 12, to: 100, toothSpacing: 0.15 } }));
    expect(created.currentRevision.lift.profile).toEqual(TWO_SLOPE);
    expect(created.currentRevision.lift.angle).toBeUndefined();
    const back = await updateLift(eng, created.id, { version: 1, lift: { ...liftBody().lift, profile: null } });
    expect(back.currentRevision.lift.profile).toBeNull();
    expect(back.currentRevision.lift.angle).toBe(40);
  });

  it("refuses a kinked join, a slope beyond 80° and a zero radius with paths and units, and stores nothing", async () => {
    const before = await designCounts(org.organisationId);
    const bad = structuredClone(TWO_SLOPE) as Record<string, unknown>[];
    bad[2].angle = 25; // the arc before ends at 20°
    bad[3].radius = 0;
    bad[4].angle = 85;
    const err = await expectHttpError(() => createLift(org.as.engineer, liftBody({ name: "Kinked lift", lift: { profile: bad, ...chainExtent } })), 400);
    // Source: the format (sim/README.md, "lift.profile"): joins without kinks, radius > 0, slopes within ±80°.
    expect(err.issues).toEqual(
      expect.arrayContaining([
        { path: "lift.profile.2.angle", message: "lift.profile.2 starts at 25° but the piece before ends at 20°: put an arc between them" },
        { path: "lift.profile.3.radius", message: "lift.profile.3.radius must be greater than 0 (m)" },
        { path: "lift.profile.4.angle", message: "lift.profile.4.angle must be at most 80 (degrees)" },
      ]),
    );
    expect(await designCounts(org.organisationId)).toEqual(before);
  });
});
