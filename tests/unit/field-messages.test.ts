import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldErrors, labelPaths } from "@/lib/client/field-messages";
import { driveSchema, trainSchema } from "@/sim/schema";

const FIELDS = [
  { path: "drive.speed", label: "Chain speed", q: "speed" as const },
  { path: "entrySpeed", label: "Entry speed", q: "speed" as const },
  { path: "lift.chainTo", label: "Chain ends at", q: "length" as const },
  { path: "lift.chainFrom", label: "Chain starts at", q: "length" as const },
];

describe("form messages in words", () => {
  it("names the field and gives the bound in the reader's unit", () => {
    const schema = z.object({ drive: driveSchema, entrySpeed: trainSchema.shape.entrySpeed });
    const r = schema.safeParse({ drive: { speed: 0, rampTime: 2, sprocketTeeth: 12, efficiency: 0.9 }, entrySpeed: Number.NaN });
    expect(r.success).toBe(false);
    const si = fieldErrors(r.error!.issues, FIELDS, "si");
    expect(si["drive.speed"]).toBe("Chain speed must be greater than 0 m/s");
    expect(si.entrySpeed).toBe("Entry speed must be a number");
    const us = fieldErrors(r.error!.issues, FIELDS, "us");
    expect(us["drive.speed"]).toBe("Chain speed must be greater than 0 ft/s");
  });

  it("shows every message at once and no dotted path", () => {
    const errs = fieldErrors(
      [
        { path: "lift.chainTo", message: "lift.chainTo must be greater than lift.chainFrom" },
        { path: "rows.2.takeUpPosition", message: "rows.2.takeUpPosition must be a finite number" },
      ],
      FIELDS,
      "si",
    );
    expect(errs["lift.chainTo"]).toBe("Chain ends at must be greater than Chain starts at");
    expect(errs["rows.2.takeUpPosition"]).toBe("This value must be a finite number");
    expect(Object.keys(errs)).toHaveLength(2);
    expect(labelPaths("lift.chainFrom is required", FIELDS)).toBe("Chain starts at is required");
    // The engine's section prefix goes with the path; a path inside a longer word is left alone.
    const scenario = [{ path: "startPosition", label: "Start position", q: "length" as const }];
    expect(labelPaths("train.startPosition must lie on the track", scenario)).toBe("Start position must lie on the track");
    expect(labelPaths("startPositionX stays", scenario)).toBe("startPositionX stays");
  });
});
