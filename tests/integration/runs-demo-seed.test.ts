import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { getModels } from "@/models";
import { getSequelize } from "@/lib/db/sequelize";
import { parseScenario } from "@/sim/schema";
import { DEMO_LIFTS, DEMO_PARK, DEMO_SCENARIOS, DEMO_TRAINS } from "@/lib/demo/park";
import { seedDemoDesign, seedDemoRuns } from "@/lib/demo/seed";
import { checkDemoExpectations } from "@/lib/demo/expectations";
import type { FigureSource } from "@/lib/demo/figures";
import { decodeResult } from "@/lib/runs/result-format";
import { json } from "@/lib/runs/serialize";
import { meshConfidenceOf } from "@/lib/runs/mesh";
import { closeDb } from "./design-fixtures";

afterAll(closeDb);

async function parkCounts(organisationId: number) {
  const { Lift, Train, Scenario, Run } = getModels();
  return {
    lifts: await Lift.count({ where: { organisationId } }),
    trains: await Train.count({ where: { organisationId } }),
    scenarios: await Scenario.count({ where: { organisationId } }),
    runs: await Run.count({ where: { organisationId } }),
  };
}

describe("the seeded demo park (npm test seeds it like npm start)", () => {
  it("has both lifts with their revisions, both trains and every scenario with a finished run", async () => {
    const { Organisation, Lift, LiftRevision, Train, Scenario, Run } = getModels();
    const org = await Organisation.findOne({ where: { slug: DEMO_PARK.slug } });
    expect(org).not.toBeNull();
    for (const l of DEMO_LIFTS) {
      const lift = await Lift.findOne({ where: { organisationId: org!.id, name: l.name } });
      expect(lift, l.name).not.toBeNull();
      expect(await LiftRevision.count({ where: { liftId: lift!.id } })).toBeGreaterThanOrEqual(l.revisions.length);
    }
    for (const t of DEMO_TRAINS) expect(await Train.findOne({ where: { organisationId: org!.id, name: t.name } }), t.name).not.toBeNull();
    for (const s of DEMO_SCENARIOS) {
      const sc = await Scenario.findOne({ where: { organisationId: org!.id, name: s.name } });
      expect(sc, s.name).not.toBeNull();
      const done = await Run.findOne({ where: { scenarioId: sc!.id, status: "done" } });
      expect(done, `finished run of ${s.name}`).not.toBeNull();
    }
  });

  it("stores as each run's inputs exactly the scenario of its public/scenarios file", async () => {
    const { Organisation, Scenario, Run } = getModels();
    const org = (await Organisation.findOne({ where: { slug: DEMO_PARK.slug } }))!;
    for (const s of DEMO_SCENARIOS) {
      const file = JSON.parse(readFileSync(path.join(process.cwd(), "public", "scenarios", `${s.key}.json`), "utf8"));
      const parsed = parseScenario(file);
      expect(parsed.ok).toBe(true);
      const sc = (await Scenario.findOne({ where: { organisationId: org.id, name: s.name } }))!;
      const run = (await Run.findOne({ where: { scenarioId: sc.id, status: "done" }, order: [["id", "ASC"]] }))!;
      expect(json(run.inputs), s.key).toEqual(parsed.ok ? parsed.scenario : null);
    }
  });

  it("keeps the phenomena in the stored runs", async () => {
    const { Organisation, Scenario, Run } = getModels();
    const org = (await Organisation.findOne({ where: { slug: DEMO_PARK.slug } }))!;
    const runs = new Map<string, FigureSource>();
    for (const s of DEMO_SCENARIOS) {
      const sc = (await Scenario.findOne({ where: { organisationId: org.id, name: s.name } }))!;
      const run = (await Run.scope("withResult").findOne({ where: { scenarioId: sc.id, status: "done" }, order: [["id", "ASC"]] }))!;
      const result = decodeResult(run.result!) as { series: FigureSource["series"] };
      runs.set(s.key, { summary: json(run.summary), series: result.series, inputs: json(run.inputs) });
    }
    for (const s of DEMO_SCENARIOS) {
      // Our own criteria per scenario (lib/demo/park.ts): common practice, no source.
      expect(checkDemoExpectations(s, runs).filter((c) => !c.ok).map((c) => c.text), s.key).toEqual([]);
    }
  });

  it("stores with every demo run its figures against a coarser mesh", async () => {
    const { Organisation, Scenario, Run } = getModels();
    const org = (await Organisation.findOne({ where: { slug: DEMO_PARK.slug } }))!;
    for (const s of DEMO_SCENARIOS) {
      const sc = (await Scenario.findOne({ where: { organisationId: org.id, name: s.name } }))!;
      const run = (await Run.findOne({ where: { scenarioId: sc.id, status: "done" }, order: [["id", "ASC"]] }))!;
      const mc = meshConfidenceOf(json(run.diagnostics));
      expect(mc, s.key).not.toBeNull();
      const summary = json(run.summary) as Record<string, unknown>;
      // Source: the comparison is against half the run's segments (Richardson's refinement ratio r = 2).
      expect(mc!.fineSegments, s.key).toBe(summary.segments);
      expect(mc!.coarseSegments, s.key).toBeLessThan(mc!.fineSegments);
      expect(mc!.figures.find((f) => f.key === "peakTension")!.fine, s.key).toBe(summary.peakTension);
    }
  });

  it("seeds again without adding or changing anything", async () => {
    const { Organisation } = getModels();
    const org = (await Organisation.findOne({ where: { slug: DEMO_PARK.slug } }))!;
    const before = await parkCounts(org.id);
    const t0 = Date.now();
    await seedDemoDesign(getSequelize());
    await seedDemoRuns(getSequelize());
    expect(Date.now() - t0).toBeLessThan(5_000);
    expect(await parkCounts(org.id)).toEqual(before);
  });
});
