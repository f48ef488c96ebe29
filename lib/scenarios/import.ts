import type { Scenario as EngineScenario } from "@/sim/schema";
import { getSequelize } from "@/lib/db/sequelize";
import { getModels } from "@/models";
import { badRequest, zodIssues } from "@/lib/http/errors";
import { clipText } from "@/lib/http/text";
import { assertCan, type Actor } from "@/lib/http/actor";
import { recordAudit } from "@/lib/audit/record";
import { createLiftIn, type LiftView } from "@/lib/lifts/service";
import { liftRevisionSchema } from "@/lib/lifts/schema";
import { trainView, type TrainView } from "@/lib/trains/service";
import { DEFAULT_RIDER_MASS } from "@/lib/trains/schema";
import { createScenarioIn, type ScenarioView } from "./service";
import { scenarioInputSchema } from "./schema";
import { readScenarioFile } from "./format";

export interface ImportResult {
  scenario: ScenarioView;
  lift: LiftView;
  train: TrainView;
}

const IMPORTED_TRAIN_NOTE =
  "Imported from a scenario file, which gives one car mass: it is stored as the empty car mass with no seats " +
  "(scenario loading: empty), so the engine sees exactly the file's car mass. Add seats and rider mass to model loading cases.";

const clip = clipText;

/**
 * Imports a `tautline-scenario/2` file (a version 1 file is converted on read and keeps its ideal
 * drive): validates it completely (400 with every problem at once, nothing stored), then creates a lift
 * with revision 1, a train and the scenario in one transaction. The drive model and the chain's and
 * take-up's damping go into the revision (they are the lift's); the contacts into the scenario.
 * Exporting the new scenario gives back the file's values (with the format's defaults filled in).
 */
export async function importScenario(actor: Actor, file: unknown): Promise<ImportResult> {
  assertCan(actor, "design:write");
  const parsed = readScenarioFile(file);
  if (!parsed.ok) throw badRequest("The scenario file has problems; nothing was imported.", parsed.issues);
  const s: EngineScenario = parsed.scenario;
  // A scenario row holds one train; a file with several is refused rather than cut short.
  if (s.trains.length !== 1)
    throw badRequest("The scenario file has problems; nothing was imported.", [
      { path: "trains", message: `trains has ${s.trains.length} trains; Tautline stores one train per scenario (import each train as its own scenario)` },
    ]);
  const train0 = s.trains[0]!;

  const revisionParsed = liftRevisionSchema.safeParse({
    name: clip(s.name, 120),
    site: null,
    notes: s.description ?? null,
    chainSpecId: null,
    lift: s.lift,
    chain: s.chain,
    drive: s.drive,
    takeUp: s.takeUp,
    antiRollback: s.antiRollback,
    limits: s.limits,
  });
  // The file passed the format's rules; our own rules for names (e.g. no control characters) may still refuse.
  const nameParsed = scenarioInputSchema.shape.name.safeParse(s.name);
  const ownIssues = [
    ...(revisionParsed.success ? [] : zodIssues(revisionParsed.error).map((i) => ({ ...i, path: i.path === "notes" ? "description" : i.path }))),
    ...(nameParsed.success ? [] : zodIssues(nameParsed.error).map((i) => ({ ...i, path: "name" }))),
  ];
  if (!revisionParsed.success || !nameParsed.success) {
    const unique = ownIssues.filter((i, k) => ownIssues.findIndex((j) => j.path === i.path && j.message === i.message) === k);
    throw badRequest("The scenario file has problems; nothing was imported.", unique);
  }
  const revision = revisionParsed.data;

  const { Train } = getModels();
  return getSequelize().transaction(async (transaction) => {
    const lift = await createLiftIn(actor, revision, `Imported from a ${parsed.format} file`, "import", transaction);
    const trainRow = await Train.create(
      {
        organisationId: actor.organisationId,
        name: clip(`${s.name} – train`, 120),
        notes: IMPORTED_TRAIN_NOTE,
        cars: train0.cars,
        carMassEmpty: train0.carMass,
        seatsPerCar: 0,
        riderMass: DEFAULT_RIDER_MASS,
        carLength: train0.carLength,
        dogOffset: train0.dogOffset,
        rollingResistance: train0.rollingResistance,
        dragArea: train0.dragArea,
        pawls: train0.pawls ?? null,
        archivedAt: null,
        createdBy: actor.id,
      },
      { transaction },
    );
    const train = trainView(trainRow);
    await recordAudit({ transaction, actor, entity: "train", entityId: trainRow.id, action: "import", after: train });

    const { Lift, LiftRevision } = getModels();
    const liftRow = (await Lift.findByPk(lift.id, { transaction }))!;
    const revRow = (await LiftRevision.findByPk(lift.currentRevision.id, { transaction }))!;
    const scenario = await createScenarioIn(
      actor,
      {
        data: {
          name: s.name,
          notes: s.description ?? null,
          liftId: lift.id,
          liftRevisionId: revRow.id,
          trainId: trainRow.id,
          loading: "empty",
          riderCount: null,
          entrySpeed: train0.entrySpeed,
          startPosition: train0.startPosition,
          startTime: train0.startTime,
          runSettings: s.run,
          dynamics: { contacts: s.contacts },
        },
        lift: liftRow,
        revision: revRow,
        train: trainRow,
      },
      "import",
      transaction,
    );
    return { scenario, lift, train };
  });
}
