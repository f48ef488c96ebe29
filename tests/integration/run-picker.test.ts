import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runPickerOptions, whatIfText } from "@/lib/runs/picker";
import { getModels } from "@/models";
import { closeDb } from "./design-fixtures";
import { opsFakes, opsWorld } from "./logbook-fixtures";

let fakes: Awaited<ReturnType<typeof opsFakes>>;
let w: Awaited<ReturnType<typeof opsWorld>>;

beforeAll(async () => {
  fakes = await opsFakes();
  w = await opsWorld("picker", { run: true });
});
afterAll(async () => {
  await fakes.close();
  await closeDb();
});

describe("run pickers", () => {
  it("label each run with what tells it apart: date, entry speed, what-if values, who, study case", async () => {
    const run = (await getModels().Run.findByPk(w.runId!))!;
    // A what-if copy of the same run: same scenario, different entry speed, started by the same engineer.
    const copy = await getModels().Run.create({ ...(run.get({ plain: true }) as object), id: undefined, overrides: { entrySpeed: 2.4 } } as never);
    const options = await runPickerOptions(w.as.viewer, { units: "us" });
    const a = options.find((o) => o.id === run.id)!;
    const b = options.find((o) => o.id === copy.id)!;
    expect(a.label).not.toBe(b.label);
    // Source: 1 ft = 0.3048 m exactly; 2.4 m/s = 7.87 ft/s.
    expect(b.label).toContain("what-if: entry speed 7.87 ft/s");
    expect(a.label).toMatch(/\d{1,2} \w{3} \d{4}, \d{2}:\d{2} UTC/);
    const engineer = await getModels().User.findByPk(run.startedBy!);
    expect(a.label).toContain(engineer!.name);
    expect(a.label).toMatch(/entry [\d.]+ ft\/s/);
    expect(a.duration).toBeGreaterThan(0);
    expect(whatIfText(null, "si")).toBeNull();
  });
});
