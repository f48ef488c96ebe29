import { describe, expect, it } from "vitest";
import { chainSchema } from "@/sim/schema";
import { STANDARD_CHAINS } from "@/lib/chains/standard";

const kN = (designation: string) => STANDARD_CHAINS.find((c) => c.designation === designation)!.breakingStrength / 1000;

describe("standard chain catalogue", () => {
  it("matches the ASME B29.1 check values", () => {
    // Source: ASME B29.1 via docs/references.md — 12,500·P² lbf: No. 80 = 55.6 kN, No. 240 = 112,500 lbf = 500 kN.
    expect(kN("ASME B29.1 No. 80")).toBeCloseTo(55.6, 1);
    expect(kN("ASME B29.1 No. 240")).toBeCloseTo(500.4, 1);
    // Source: ASME B29.1 via docs/references.md — No. 100 (P = 1.25 in) 19,531 lbf; No. 140 (1.75 in) 38,280 lbf.
    expect((kN("ASME B29.1 No. 100") * 1000) / 4.4482216152605).toBeCloseTo(19_531, 0);
    expect((kN("ASME B29.1 No. 140") * 1000) / 4.4482216152605).toBeCloseTo(38_281, 0);
  });

  it("uses the ISO 606 B-series breaking forces recalled in docs/references.md", () => {
    // From memory (docs/references.md [memory]): 16B 60, 20B 95, 24B 160, 28B 200, 32B 250, 40B 355, 48B 560 kN.
    expect(["16B", "20B", "24B", "28B", "32B", "40B", "48B"].map((s) => kN(`ISO 606 ${s}`))).toEqual([60, 95, 160, 200, 250, 355, 560]);
  });

  it("every row passes the engine's chain bounds and names its source; assumed values say so", () => {
    for (const c of STANDARD_CHAINS) {
      expect(chainSchema.safeParse({ ...c, catchSpacing: 2 }).success).toBe(true);
      expect(c.source.length).toBeGreaterThan(10);
      expect(c.note).toMatch(/assumed/);
      expect(c.note).toMatch(/approximate|memory/);
    }
  });
});
