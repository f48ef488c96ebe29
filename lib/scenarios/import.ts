import { parseScenario, type Scenario as EngineScenario } from "@/sim/schema";
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
 * Imports a `tautline-scenario/1` file: validates it completely (400 with every problem at once,
 * nothing stored), then creates a lift with revision 1, a train and the scenario in one transaction.
 * Exporting the new scenario gives back the file's values (with the format's defaults filled in).
 */
export async function importScenario(actor: Actor, file: unknown): Promise<ImportResult> {
  assertCan(actor, "design:write");
  const parsed = parseScenario(file);
  if (!parsed.ok) throw badRequest("The scenario file has problems; nothing was imported.", parsed.issues);
  const s: EngineScenario = parsed.scenario;

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
    const lift = await createLiftIn(actor, revision, "Imported from a tautline-scenario/1 file", "import", transaction);
    const trainRow = await Train.create(
      {
        organisationId: actor.organisationId,
        name: clip(`${s.name} – train`, 120),
        notes: IMPORTED_TRAIN_NOTE,
        cars: s.train.cars,
        carMassEmpty: s.train.carMass,
        seatsPerCar: 0,
        riderMass: DEFAULT_RIDER_MASS,
        carLength: s.train.carLength,
        dogOffset: s.train.dogOffset,
        rollingResistance: s.train.rollingResistance,
        dragArea: s.train.dragArea,
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
          entrySpeed: s.train.entrySpeed,
          startPosition: s.train.startPosition,
          runSettings: s.run,
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
