/**
 * Demo logbook of the invented park's Emberline lift hill: a year of elongation and take-up readings
 * (invented, slowly wearing), a lubrication, an inspection with a photo, and a logger recording of one
 * dispatch made by the engine from the park's clean pick-up scenario with a little noise (a stand-in for
 * a real logger file). Idempotent: nothing is added once the lift has logbook entries.
 */
import crypto from "node:crypto";
import type { InferCreationAttributes, Sequelize } from "sequelize";
import type { SeedStep } from "@/lib/db/seeds";
import { demoAccount } from "@/lib/auth/demo-accounts";
import { newStorageKey, putObject } from "@/lib/storage/client";
import { parseScenario } from "@/sim/schema";
import { simulate } from "@/sim/simulate";
import { initModels, type LogbookEntry } from "@/models";
import { DEMO_PARK } from "@/lib/demo/park";
import { elongationPercent, takeUpReset } from "./measure";

const LIFT = "Emberline lift hill";
const DAY = 86_400_000;
// A 1 × 1 PNG (the smallest image the photo check accepts), standing in for an inspection photo.
const PHOTO = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==", "base64");

async function tryPut(key: string, body: Buffer, type: string): Promise<boolean> {
  try {
    await putObject(key, body, type);
    return true;
  } catch (err) {
    console.warn(`[seed] object storage unreachable, demo file not stored: ${(err as Error).message}`);
    return false;
  }
}

export async function seedDemoLogbook(sequelize: Sequelize): Promise<void> {
  const m = initModels(sequelize);
  const org = await m.Organisation.findOne({ where: { slug: DEMO_PARK.slug } });
  if (!org) return;
  const lift = await m.Lift.findOne({ where: { organisationId: org.id, name: LIFT } });
  if (!lift || !lift.currentRevisionId) return;
  if (await m.LogbookEntry.count({ where: { liftId: lift.id } })) return;
  const operator = await m.User.findOne({ where: { email: demoAccount("operator").email } });
  const rev = await m.LiftRevision.findByPk(lift.currentRevisionId);
  if (!rev) return;
  const pitch = (rev.chain as { pitch: number }).pitch;
  const start = Date.UTC(2025, 10, 3, 7, 30);
  const base = { organisationId: org.id, liftId: lift.id, liftRevisionId: rev.id, userId: operator?.id ?? null, notes: null, idempotencyKey: null };
  const rows: Omit<InferCreationAttributes<LogbookEntry>, "id" | "createdAt" | "updatedAt">[] = [];
  // Before the season's readings the chain was shortened once (invented: 20 pitches out after the winter's
  // wear), so "Run with today's chain" sets the worn pitch and the shorter loop and still fits the take-up.
  const links = 20;
  rows.push({ ...base, kind: "links-removed" as const, measuredAt: new Date(start - 10 * DAY), data: { links, pitch, ...takeUpReset(links, pitch, null), positionBefore: null }, elongationPercent: null, takeUpPosition: null });
  for (let k = 0; k < 12; k++) {
    const at = new Date(start + k * 30 * DAY);
    // Invented wear: 0.8 % rising about 0.09 % a month; length over 20 pitches.
    const e = 0.8 + 0.09 * k + (k % 3 === 1 ? 0.02 : 0);
    const measuredLength = Number((20 * pitch * (1 + e / 100)).toFixed(5));
    rows.push({ ...base, kind: "elongation" as const, measuredAt: at, data: { measuredLength, pitches: 20, nominalPitch: pitch }, elongationPercent: elongationPercent(measuredLength, 20, pitch), takeUpPosition: null });
    const position = Number((1.1 + 0.035 * k).toFixed(3));
    rows.push({ ...base, kind: "take-up" as const, measuredAt: new Date(at.getTime() + 3_600_000), data: { position }, elongationPercent: null, takeUpPosition: position });
  }
  rows.push({ ...base, kind: "lubrication" as const, measuredAt: new Date(start + 45 * DAY), data: { lubricant: "Chain oil, grade as the demo park's maintenance plan says" }, elongationPercent: null, takeUpPosition: null });
  await sequelize.transaction(async (transaction) => {
    await m.LogbookEntry.bulkCreate(rows, { transaction });
    const inspection = await m.LogbookEntry.create(
      { ...base, kind: "inspection", measuredAt: new Date(start + 200 * DAY), data: { findings: "Two side plates near the crest show light rubbing; rollers turn freely. Recheck next month.", photoIds: [] }, elongationPercent: null, takeUpPosition: null },
      { transaction },
    );
    const key = newStorageKey("photos", org.id);
    if (await tryPut(key, PHOTO, "image/png")) {
      const up = await m.Upload.create(
        { organisationId: org.id, liftId: lift.id, kind: "photo", storageKey: key, originalName: "crest-side-plates.png", contentType: "image/png", bytes: PHOTO.length, sha256: crypto.createHash("sha256").update(PHOTO).digest("hex"), entryId: inspection.id, createdBy: operator?.id ?? null },
        { transaction },
      );
      await inspection.update({ data: { ...inspection.data, photoIds: [up.id] } }, { transaction });
    }
  });
  await seedDemoRecording(sequelize, org.id, lift.id, rev.id, operator?.id ?? null);
}

/** One dispatch of the clean pick-up scenario, coarse, 12 s, sampled every 0.02 s with ±1 mm noise. */
async function seedDemoRecording(sequelize: Sequelize, organisationId: number, liftId: number, revisionId: number, userId: number | null): Promise<void> {
  const m = initModels(sequelize);
  if (await m.Recording.count({ where: { liftId } })) return;
  const scenario = await m.Scenario.findOne({ where: { organisationId, liftId, name: "Emberline: clean pick-up" } });
  const run = scenario ? await m.Run.findOne({ where: { scenarioId: scenario.id, status: "done" }, order: [["id", "ASC"]] }) : null;
  if (!run) return;
  const inputs = structuredClone(run.inputs) as Record<string, Record<string, unknown>>;
  inputs.run = { ...inputs.run, duration: 12, segments: 12 };
  const parsed = parseScenario(inputs);
  if (!parsed.ok) return;
  const r = simulate(parsed.scenario, { frameBudget: 0, sampleInterval: 0.02 });
  let seed = 11;
  const noise = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 0.002;
  const lines = ["time_s,takeup_mm,train_speed_mps"];
  const samples = r.series.t.map((t, i) => ({ t, takeUpPosition: r.series.takeUpPosition[i] + noise(), trainSpeed: r.series.trainSpeed[i] }));
  for (const s of samples) lines.push(`${s.t.toFixed(3)},${(s.takeUpPosition * 1000).toFixed(2)},${s.trainSpeed.toFixed(3)}`);
  const csv = Buffer.from(lines.join("\n") + "\n", "utf8");
  const key = newStorageKey("recordings", organisationId);
  const stored = await tryPut(key, csv, "text/csv");
  const y0 = samples[0].takeUpPosition;
  await sequelize.transaction(async (transaction) => {
    const upload = stored
      ? await m.Upload.create(
          { organisationId, liftId, kind: "recording", storageKey: key, originalName: "emberline-dispatch.csv", contentType: "text/csv", bytes: csv.length, sha256: crypto.createHash("sha256").update(csv).digest("hex"), entryId: null, createdBy: userId },
          { transaction },
        )
      : null;
    const rec = await m.Recording.create(
      {
        organisationId,
        liftId,
        liftRevisionId: run.liftRevisionId || revisionId,
        uploadId: upload?.id ?? null,
        name: "Emberline dispatch, morning test run (demo)",
        mapping: { columns: { time: "time_s", takeUpPosition: "takeup_mm", trainSpeed: "train_speed_mps" }, units: { time: "s", length: "mm", force: "N", speed: "m/s", takeUpDirection: "down" } },
        channels: ["takeUpPosition", "trainSpeed"],
        sampleCount: samples.length,
        duration: samples[samples.length - 1].t,
        engagementTime: r.summary.engagementTime,
        createdBy: userId,
      },
      { transaction },
    );
    await m.RecordingSample.bulkCreate(
      samples.map((s, idx) => ({ recordingId: rec.id, idx, t: s.t, takeUpPosition: s.takeUpPosition - y0, chainTension: null, driveCurrent: null, trainPosition: null, trainSpeed: s.trainSpeed })),
      { transaction },
    );
  });
}

export const demoLogbookSeed: SeedStep = { name: "demo park: logbook, photo and a logger recording", run: seedDemoLogbook };
