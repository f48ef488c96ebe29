import { describe, expect, it } from "vitest";
import { alertMessageIn } from "@/lib/alerts/words";

describe("alert sentences in the reader's units", () => {
  it("gives a US-customary reader the millimetres of a stored alert in inches", () => {
    const si = "Foxglove: the take-up at rest is 1971 mm below the top stop, at the end of its usable travel (1966 mm).";
    const us = alertMessageIn(si, "us");
    // Source: 1 in = 25.4 mm exactly (international yard and pound agreement, 1959): 1971 mm = 77.60 in.
    expect(us).toContain("77.6");
    expect(us).toContain("in below the top stop");
    expect(us).not.toMatch(/\bmm\b/);
    expect(alertMessageIn(si, "si")).toBe(si);
  });
});
