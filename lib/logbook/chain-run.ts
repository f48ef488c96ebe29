/**
 * "Run with today's chain": a copy of one of the lift's scenarios with `chain.elongation` set from the newest
 * elongation reading in the lift's logbook and `chain.linksRemoved` from its links-removed entries (the chain's
 * shortenings since it was new), and a run of it. The copy is made once per reading (a second click
 * opens it and its run); its name says the reading it carries.
 */
import { Op } from "sequelize";
import { getModels } from "@/models";
import { getSequelize } from "@/lib/db/sequelize";
import { assertCan, ownOr404, type Actor } from "@/lib/http/actor";
import { badRequest, conflict } from "@/lib/http/errors";
import { validate } from "@/lib/http/validate";
import { clipText } from "@/lib/http/text";
import { deriveScenarioIn, getScenario, type ScenarioView } from "@/lib/scenarios/service";
import { getRun, startRun } from "@/lib/runs/service";
import type { RunView } from "@/lib/runs/serialize";
import { chainRunInputSchema } from "./schema";

export interface ChainRunView {
  /** The newest elongation reading used: when, and the elongation in % (stored on the scenario as a fraction). */
  reading: { entryId: number; measuredAt: string; elongationPercent: number; linksRemoved: number };
  scenario: ScenarioView;
  run: RunView;
  /** False when the copy for this reading already existed (it was opened, not made again). */
  created: boolean;
}

/** The copy's name: the source's name with the reading's elongation, links removed and date. */
export function chainRunName(source: string, percent: number, at: Date, linksRemoved = 0): string {
  const links = linksRemoved > 0 ? `, ${linksRemoved} links out` : "";
  return `${clipText(source, 140)} · chain ${percent.toFixed(2)} %${links} (${at.toISOString().slice(0, 10)})`;
}

export async function runWithTodaysChain(actor: Actor, liftId: number, input: unknown): Promise<ChainRunView> {
  assertCan(actor, "logbook:write");
  assertCan(actor, "run:start");
  const { Lift, Scenario, LogbookEntry, Run } = getModels();
  const lift = ownOr404(await Lift.findByPk(liftId), actor, "Lift");
  const { scenarioId } = validate(chainRunInputSchema, input);
  const source = await Scenario.findByPk(scenarioId);
  if (!source || source.organisationId !== actor.organisationId || source.liftId !== lift.id)
    throw badRequest("Choose a scenario of this lift.", [{ path: "scenarioId", message: `scenarioId ${scenarioId}: not a scenario of ${lift.name}` }]);
  if (source.archivedAt) throw badRequest("That scenario is archived.", [{ path: "scenarioId", message: "that scenario is archived; restore it or choose another" }]);
  const reading = await LogbookEntry.findOne({
    where: { liftId: lift.id, kind: "elongation", elongationPercent: { [Op.ne]: null } },
    order: [["measuredAt", "DESC"], ["id", "DESC"]],
  });
  if (!reading || reading.elongationPercent === null)
    throw conflict(`${lift.name} has no chain elongation reading in its logbook yet: add one (kind "elongation") first.`);
  const percent = reading.elongationPercent;
  // Readings below zero (a new chain measured a hair short) count as no elongation.
  const fraction = Math.max(0, percent) / 100;
  // Every links-removed entry up to the reading shortened the loop the reading measured.
  const removals = await LogbookEntry.findAll({ where: { liftId: lift.id, kind: "links-removed", measuredAt: { [Op.lte]: reading.measuredAt } } });
  const linksRemoved = removals.reduce((sum, r) => sum + (Number((r.data as { links?: unknown }).links) || 0), 0);
  const name = chainRunName(source.name, percent, reading.measuredAt, linksRemoved);

  const existing = await Scenario.findOne({ where: { organisationId: actor.organisationId, liftId: lift.id, name, archivedAt: null } });
  if (existing) {
    const last = await Run.findOne({ where: { scenarioId: existing.id, status: { [Op.ne]: "failed" } }, order: [["id", "DESC"]] });
    const run = last ? await getRun(actor, last.id) : await startRun(actor, existing.id, {});
    return { reading: readingView(reading.id, reading.measuredAt, percent, linksRemoved), scenario: await getScenario(actor, existing.id), run, created: false };
  }

  const notes = clipText(
    `Copy of "${source.name}" with the chain as measured in the logbook: elongation ${percent.toFixed(2)} % on ${reading.measuredAt.toISOString().slice(0, 10)} (logbook entry ${reading.id})${linksRemoved > 0 ? `, ${linksRemoved} links removed before it` : ""}.${source.notes ? `\n\n${source.notes}` : ""}`,
    5000,
  );
  // The copy is audited as a created scenario (its notes name the reading); the run as a started run.
  const scenario = await getSequelize().transaction((transaction) =>
    deriveScenarioIn(actor, source, { name, notes, dynamics: { chain: { elongation: fraction, ...(linksRemoved > 0 ? { linksRemoved } : {}) } } }, "create", transaction),
  );
  const run = await startRun(actor, scenario.id, {});
  return { reading: readingView(reading.id, reading.measuredAt, percent, linksRemoved), scenario, run, created: true };
}

const readingView = (entryId: number, at: Date, percent: number, linksRemoved: number) => ({
  entryId,
  measuredAt: at.toISOString(),
  elongationPercent: percent,
  linksRemoved,
});
