import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createRecording } from "@/lib/recordings/service";
import { getModels } from "@/models";
import { closeDb, expectHttpError } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("reclim");
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

async function counts() {
  const { Recording, RecordingSample, Upload } = getModels();
  return {
    recordings: await Recording.count({ where: { organisationId: w.organisationId } }),
    samples: await RecordingSample.count(),
    uploads: await Upload.count({ where: { organisationId: w.organisationId } }),
  };
}

const mapping = { time: "t", chainTension: "tension", takeUpPosition: "takeup" };
const units = { time: "s", length: "m", force: "lbf", speed: "m/s", takeUpDirection: "down" };
const upload = (csv: string, extra: Record<string, unknown> = {}) =>
  createRecording(w.as.operator, { liftId: w.liftId, name: "Overflow", csv, mapping, units, ...extra });

describe("logger values that overflow after conversion", () => {
  it("1e308 lbf (Infinity in newtons) answers 400 naming the row and column, and stores nothing", async () => {
    const before = await counts();
    const err = await expectHttpError(() => upload("t,tension,takeup\n0,1000,0\n0.1,1e308,0.01\n0.2,1000,0.02\n"), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["rows.3.chainTension"]);
    expect(err.issues[0].message).toMatch(/1e\+308 lbf is beyond .* N once converted/);
    expect(await counts()).toEqual(before);
  });

  it("-1e308 m (finite, but its difference from the first reading is not) answers 400 and stores nothing", async () => {
    const before = await counts();
    const err = await expectHttpError(() => upload("t,tension,takeup\n0,1000,1e308\n0.1,1000,-1e308\n"), 400);
    expect(err.issues.map((i) => i.path)).toEqual(["rows.2.takeUpPosition", "rows.3.takeUpPosition"]);
    expect(await counts()).toEqual(before);
  });

  it("an engagement time of 1e308 s, or one outside the recording, is refused", async () => {
    const csv = "t,tension,takeup\n0,1000,0\n0.1,1000,0.01\n";
    expect((await expectHttpError(() => upload(csv, { engagementTime: 1e308 }), 400)).issues.map((i) => i.path)).toEqual(["engagementTime"]);
    expect((await expectHttpError(() => upload(csv, { engagementTime: 50 }), 400)).issues.map((i) => i.path)).toEqual(["engagementTime"]);
  });

  it("a write that fails after the file was stored removes the file and its row", async () => {
    const before = await counts();
    const { RecordingSample } = getModels();
    const spy = vi.spyOn(RecordingSample, "bulkCreate").mockRejectedValueOnce(new Error("connection lost"));
    try {
      await expect(upload("t,tension,takeup\n0,1000,0\n0.1,1000,0.01\n")).rejects.toThrow("connection lost");
    } finally {
      spy.mockRestore();
    }
    expect(await counts()).toEqual(before);
  });
});
