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
  /** The lead train (the file's trains[0]). */
  train: TrainView;
  /** One train row per following train of the file (trains[1..n]), in order. */
  followerTrains: TrainView[];
}

const IMPORTED_TRAIN_NOTE =
  "Imported from a scenario file, which gives one car mass: it is stored as the empty car mass with no seats " +
  "(scenario loading: empty), so the engine sees exactly the file's car mass. Add seats and rider mass to model loading cases.";

const clip = clipText;

/**
 * Imports a `tautline-scenario/2` file (a version 1 file is converted on read and keeps its ideal
 * drive): validates it completely (400 with every problem at once, nothing stored), then creates a lift
 * with revision 1, a train row per train of the file and the scenario in one transaction: the file's
 * trains[0] becomes the scenario's lead train, trains[1..n] its following trains (each its own train row,
 * loading "empty", so the engine sees exactly the file's car masses). The drive model and the chain's and
 * take-up's damping go into the revision (they are the lift's); the contacts into the scenario.
 * Exporting the new scenario gives back the file's values (with the format's defaults filled in).
 */
export async function importScenario(actor: Actor, file: unknown): Promise<ImportResult> {
  assertCan(actor, "design:write");
  const parsed = readScenarioFile(file);
  if (!parsed.ok) throw badRequest("The scenario file has problems; nothing was imported.", parsed.issues);
  const s: EngineScenario = parsed.scenario;
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
  const many = s.trains.length > 1;
  return getSequelize().transaction(async (transaction) => {
    const lift = await createLiftIn(actor, revision, `Imported from a ${parsed.format} file`, "import", transaction);
    const trainRows = [];
    for (const [i, t] of s.trains.entries()) {
      const row = await Train.create(
        {
          organisationId: actor.organisationId,
          name: clip(`${s.name} – train${many ? ` ${i + 1}` : ""}`, 120),
          notes: IMPORTED_TRAIN_NOTE,
          cars: t.cars,
          carMassEmpty: t.carMass,
          seatsPerCar: 0,
          riderMass: DEFAULT_RIDER_MASS,
          carLength: t.carLength,
          dogOffset: t.dogOffset,
          rollingResistance: t.rollingResistance,
          dragArea: t.dragArea,
          pawls: t.pawls ?? null,
          archivedAt: null,
          createdBy: actor.id,
        },
        { transaction },
      );
      await recordAudit({ transaction, actor, entity: "train", entityId: row.id, action: "import", after: trainView(row) });
      trainRows.push(row);
    }
    const [trainRow, ...followerRows] = trainRows as [(typeof trainRows)[number], ...typeof trainRows];
    const train = trainView(trainRow);

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
          followers: s.trains.slice(1).map((t, i) => ({
            trainId: followerRows[i]!.id,
            loading: "empty" as const,
            riderCount: null,
            entrySpeed: t.entrySpeed,
            startPosition: t.startPosition,
            startTime: t.startTime,
          })),
        },
        lift: liftRow,
        revision: revRow,
        train: trainRow,
        followerTrains: followerRows,
      },
      "import",
      transaction,
    );
    return { scenario, lift, train, followerTrains: followerRows.map((r) => trainView(r)) };
  });
}
