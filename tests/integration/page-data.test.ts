/**
 * What the workspace's pages load through lib/ (pages never query models/): the dashboard's recent runs,
 * a run's and a study's heading, the logbook's choice of lifts, a recording's page, the workspace frame's
 * organisation name and an invitation's look. Each keeps its organisation scoping: another's row is 404.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { getModels } from "@/models";
import type { Actor } from "@/lib/http/actor";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { DEMO_PARK, DEMO_SCENARIOS } from "@/lib/demo/park";
import { lookUpInvitation, organisationName } from "@/lib/auth/accounts";
import { issueToken } from "@/lib/auth/tokens";
import { liftChoices } from "@/lib/lifts/service";
import { getRecordingPage } from "@/lib/recordings/service";
import { RECENT_RUNS_LIMIT, recentRuns } from "@/lib/runs/recent";
import { getRunHeading } from "@/lib/runs/service";
import { json } from "@/lib/runs/serialize";
import { getStudyHeading } from "@/lib/studies/service";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsWorld } from "./logbook-fixtures";

let park: { organisationId: number; engineer: Actor };
let other: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  const { Organisation, User } = getModels();
  const org = (await Organisation.findOne({ where: { slug: DEMO_PARK.slug } }))!;
  const u = (await User.findOne({ where: { email: demoAccount("engineer").email } }))!;
  park = { organisationId: org.id, engineer: { id: u.id, organisationId: org.id, role: u.role as Actor["role"] } };
  other = await opsWorld("pagedata", { run: true });
});
afterAll(closeDb);

describe("the dashboard's recent runs", () => {
  it("lists the newest scenario runs that are not study cases, newest first, of the reader's organisation only", async () => {
    const { Run, StudyCase } = getModels();
    const lines = await recentRuns(park.engineer);
    expect(lines.length).toBeGreaterThan(0);
    expect(lines.length).toBeLessThanOrEqual(RECENT_RUNS_LIMIT);
    const ids = lines.map((l) => l.id);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
    // The seeded demo study's cases are the park's newest runs; none of them is listed.
    const caseRunIds = (await StudyCase.findAll({ where: { runId: { [Op.ne]: null } }, attributes: ["runId"] })).map((c) => c.runId!);
    expect(caseRunIds.length).toBeGreaterThan(0);
    expect(ids.filter((id) => caseRunIds.includes(id))).toEqual([]);
    // The newest of the park's other runs heads the list.
    const newest = await Run.findOne({ where: { organisationId: park.organisationId, id: { [Op.notIn]: caseRunIds } }, order: [["id", "DESC"]], attributes: ["id"] });
    expect(ids[0]).toBe(newest!.id);
    expect(ids).not.toContain(other.runId);
    expect((await recentRuns(other.as.viewer)).map((l) => l.id)).toEqual([other.runId]);
  });

  it("gives the fast-chain demo run's failed safety-factor check and its headline figures as plain data", async () => {
    const { Run, Scenario } = getModels();
    const def = DEMO_SCENARIOS.find((s) => s.key === "emberline-fast-chain-snatch")!;
    const scenario = (await Scenario.findOne({ where: { organisationId: park.organisationId, name: def.name } }))!;
    const run = (await Run.findOne({ where: { scenarioId: scenario.id, status: "done" }, order: [["id", "ASC"]] }))!;
    const summary = json<{ peakTension: number; minSafetyFactor: number }>(run.summary);
    const limits = json<{ limits: { requiredSafetyFactor: number } }>(run.inputs).limits;
    // Source: the run's own stored limit (required safety factor 5, an assumption named in sim/schema.ts
    // LIMIT_SOURCES); the demo scenario is meant to fall below it (lib/demo/park.ts "shows").
    expect(summary.minSafetyFactor).toBeLessThan(limits.requiredSafetyFactor);
    const line = (await recentRuns(park.engineer, { limit: 100 })).find((l) => l.id === run.id);
    expect(line, "the fast-chain demo run is among the park's newest 100 non-study runs").toBeDefined();
    expect(line!.failedChecks.map((c) => c.key)).toContain("safetyFactor");
    expect(line!.scenarioName).toBe(def.name);
    expect(line!.headline?.peakTension).toBe(summary.peakTension);
    expect(line!.whatIf).toBe(false);
  });

  it("among the newest runs of the freshly seeded park, at least one fails a check", async () => {
    const lines = await recentRuns(park.engineer);
    expect(lines.some((l) => l.failedChecks.length > 0)).toBe(true);
  });
});

describe("page headings and choices", () => {
  it("a run's heading names its scenario and study case; another organisation's run is 404", async () => {
    const { Scenario, StudyCase } = getModels();
    const head = await getRunHeading(other.as.viewer, other.runId!);
    expect(head.scenarioName).toBe((await Scenario.findByPk(other.scenarioId))!.name);
    expect(head.studyCase).toBeNull();
    const c = (await StudyCase.findOne({ where: { runId: { [Op.ne]: null } }, attributes: ["runId", "studyId", "idx"] }))!;
    const caseHead = await getRunHeading(park.engineer, c.runId!);
    expect(caseHead.studyCase).toMatchObject({ studyId: c.studyId, index: c.idx + 1 });
    await expectHttpError(() => getRunHeading(other.as.viewer, c.runId!), 404);
    await expectHttpError(() => getRunHeading(park.engineer, other.runId!), 404);
  });

  it("a study's heading is its name; another organisation's study is 404", async () => {
    const study = (await getModels().Study.findOne({ where: { organisationId: park.organisationId } }))!;
    expect(await getStudyHeading(park.engineer, study.id)).toEqual({ id: study.id, name: study.name });
    await expectHttpError(() => getStudyHeading(other.as.viewer, study.id), 404);
  });

  it("the logbook offers the organisation's lifts in use, by name", async () => {
    expect(await liftChoices(other.as.operator)).toEqual([{ id: other.liftId, name: (await getModels().Lift.findByPk(other.liftId))!.name }]);
    // An archived lift is no longer offered.
    await (await getModels().Lift.findByPk(other.liftId))!.update({ archivedAt: new Date() });
    expect(await liftChoices(other.as.operator)).toEqual([]);
    expect((await liftChoices(park.engineer)).map((l) => l.id)).not.toContain(other.liftId);
  });

  it("a recording's page has its lift, scenarios, runs and settle-back; another organisation's recording is 404", async () => {
    const rec = (await getModels().Recording.findOne({ where: { organisationId: park.organisationId } }))!;
    const page = await getRecordingPage(park.engineer, rec.id, "si");
    expect(page.recording.id).toBe(rec.id);
    expect(page.lift?.name).toBe((await getModels().Lift.findByPk(rec.liftId))!.name);
    expect(page.scenarios.length).toBeGreaterThan(0);
    expect(page.runs.length).toBeGreaterThan(0);
    await expectHttpError(() => getRecordingPage(other.as.viewer, rec.id, "si"), 404);
  });

  it("the frame's organisation name, and an invitation's look before it is used", async () => {
    const org = (await getModels().Organisation.findByPk(other.organisationId))!;
    expect(await organisationName(other.organisationId)).toBe(org.name);
    const invited = await getModels().User.create({ organisationId: other.organisationId, email: `invited.${org.slug}@design-test.example`, name: "Invited", role: "operator", passwordHash: null });
    const { token } = await issueToken(invited.id, "invite");
    expect(await lookUpInvitation(token)).toEqual({ state: "usable", email: invited.email, name: "Invited", role: "operator", organisationName: org.name });
    await invited.update({ passwordHash: "set elsewhere" });
    expect(await lookUpInvitation(token)).toEqual({ state: "used" });
    expect(await lookUpInvitation("x".repeat(43))).toEqual({ state: "unknown" });
  });
});
