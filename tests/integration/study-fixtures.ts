import { getModels } from "@/models";
import type { Actor } from "@/lib/http/actor";
import { getStudy, type StudyView } from "@/lib/studies/service";
import { importForRuns, shortScenarioFile } from "./runs-fixtures";

/** The example lift hill on a coarse mesh (16 segments, 8 s): a case takes well under a second. */
export async function studyScenario(actor: Actor, name: string) {
  const ids = await importForRuns(actor, shortScenarioFile(name, { duration: 8, segments: 16 }));
  // Seats so the loading cases differ: empty 1000 kg, full 1000 + 4 × 75 = 1300 kg per car.
  await getModels().Train.update({ carMassEmpty: 1000, seatsPerCar: 4, riderMass: 75 }, { where: { id: ids.trainId } });
  return ids;
}

/**
 * Reads the study (as a client would) until `pred` holds. The default wait stays inside vitest's 60 s test
 * limit, so a stuck study fails with its state rather than a bare timeout; longer tests pass their own.
 */
export async function waitForStudy(actor: Actor, id: number, pred: (s: StudyView) => boolean, timeoutMs = 50_000): Promise<StudyView> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const s = await getStudy(actor, id);
    if (pred(s)) return s;
    if (Date.now() > until) throw new Error(`study ${id} did not get there: ${s.status} ${s.casesDone}/${s.casesTotal}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export const finishedStudy = (s: StudyView) => ["done", "failed", "cancelled"].includes(s.status);
