import { describe, expect, it } from "vitest";
import { keyInWords, limitLabel, limitValue } from "@/lib/reports/assumptions";

describe("report assumptions in words", () => {
  it("labels known limits in words and unknown ones from their key, never as the key itself", () => {
    expect(limitLabel("requiredSafetyFactor")).toBe("Required safety factor on breaking strength");
    expect(limitLabel("fatigueFraction")).toBe("Fatigue fraction");
    expect(keyInWords("maxLongitudinalAccel")).toBe("Max longitudinal accel");
  });

  it("states values with units in the reader's system", () => {
    // Source: NIST SP 811: 1 hp (mechanical) = 745.7 W, so 250 kW = 335.3 hp.
    expect(limitValue("motorRating", 250_000, "us")).toBe("335.3 hp");
    expect(limitValue("motorRating", 250_000, "si")).toBe("250.0 kW");
    // Source: a temperature difference of 1 K = 1.8 °F (NIST SP 811).
    expect(limitValue("thermalDeltaT", 40, "us")).toBe("72 °F");
    expect(limitValue("thermalExpansion", 11.7e-6, "si")).toBe("11.7 × 10⁻⁶ per K");
    expect(limitValue("thermalExpansion", 11.7e-6, "us")).toBe("6.50 × 10⁻⁶ per °F");
    expect(limitValue("allowRollback", false, "si")).toBe("no");
    expect(limitValue("motorRating", undefined, "si")).toBe("not given");
  });
});
