import { describe, expect, it } from "vitest";
import example from "@/sim/examples/lift-hill-example.json";
import { dogTensionAt, parseScenario, simulate } from "@/sim";
import { PANELS, chainSpeedSeries, panelData, seriesCsv } from "@/components/plot/plotData";

describe("chain tension at the dog in the plots and the CSV", () => {
  const parsed = parseScenario({ ...example, run: { ...example.run, duration: 45, segments: 30 } });
  if (!parsed.ok) throw new Error("example scenario");
  const s = parsed.scenario;
  const r = simulate(s, { frameBudget: 150 });
  const chain = chainSpeedSeries(r.series.t, s.drive.speed, s.drive.rampTime);
  const dog = dogTensionAt(r.layout, { dogOffset: s.trains[0]!.dogOffset, dogRelease: s.lift.dogRelease }, r.frames, r.series.t);
  const tension = PANELS.find((p) => p.id === "tension")!;

  it("is a line of the tension panel, in the user's force unit, with gaps off the chain", () => {
    expect(tension.lines.map((l) => l.key)).toEqual(["driveTension", "maxTension", "dogTension"]);
    expect(tension.note).toMatch(/just ahead of the dog's catch point/);
    const col = tension.lines.findIndex((l) => l.key === "dogTension") + 1;
    const si = panelData(tension, r.series, { chainSpeed: chain, dogTension: dog }, "si")[col];
    const us = panelData(tension, r.series, { chainSpeed: chain, dogTension: dog }, "us")[col];
    // Source: NIST SP 811 Appendix B: 1 kip = 1000 lbf = 4448.222 N (the screen shows kN or kip).
    const i = dog.findIndex((v) => v !== null && v > 0);
    expect(si[i]).toBeCloseTo(dog[i]! / 1000, 9);
    expect(us[i]! * 4448.222).toBeCloseTo(dog[i]!, -1);
    // The example's train passes the dog release at the crest before the run ends: a gap there.
    expect(dog.at(-1)).toBeNull();
    expect(si.at(-1)).toBeNull();
    // Without frames there is no line to draw.
    expect(panelData(tension, r.series, { chainSpeed: chain }, "si")[col].every((v) => v === null)).toBe(true);
  });

  it("is a CSV column when given, with empty cells where the dog is off the chain", () => {
    const rows = seriesCsv(r.series, chain, "si", dog).trim().split("\n");
    const head = rows[0].split(",");
    const col = head.indexOf("Chain tension: At the dog (kN)");
    expect(col).toBeGreaterThan(0);
    const cells = rows.slice(1).map((row) => row.split(",")[col]);
    expect(cells).toHaveLength(dog.length);
    cells.forEach((c, k) => {
      if (dog[k] === null) expect(c).toBe("");
      else expect(Number(c)).toBeCloseTo(dog[k]! / 1000, 3);
    });
    // Without it, the export keeps its former columns.
    expect(seriesCsv(r.series, chain, "si").split("\n")[0]).not.toContain("At the dog");
  });
});
