/**
 * Run pickers (replay sessions, overlays): one line per finished run saying what tells it apart from its
 * neighbours — scenario, when it ran, its entry speed, its what-if values, who started it, and whether it
 * is a study case — in the reader's units.
 */
import { Op } from "sequelize";
import type { Actor } from "@/lib/http/actor";
import { formatQuantity, type UnitSystem } from "@/lib/client/units";
import { OVERRIDE_FIELDS, RUN_OVERRIDE_KEYS, type RunOverrides } from "@/lib/runs/overrides";
import { getModels } from "@/models";

export interface RunPickerOption {
  id: number;
  label: string;
  /** Simulated seconds, for captions and pins. */
  duration: number;
}

const when = (d: Date) => `${d.toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" })} UTC`;

export function whatIfText(overrides: RunOverrides | null | undefined, units: UnitSystem): string | null {
  if (!overrides) return null;
  const parts = RUN_OVERRIDE_KEYS.filter((k) => overrides[k] !== undefined).map((k) => `${OVERRIDE_FIELDS[k].label.toLowerCase()} ${formatQuantity(overrides[k], OVERRIDE_FIELDS[k].quantity, units)}`);
  return parts.length ? `what-if: ${parts.join(", ")}` : null;
}

/** The organisation's newest finished runs (of the given lift revisions, when named), labelled for a picker. */
export async function runPickerOptions(actor: Actor, opts: { units: UnitSystem; liftRevisionIds?: number[]; limit?: number }): Promise<RunPickerOption[]> {
  const { Run, Scenario, User, StudyCase, LiftRevision } = getModels();
  const runs = await Run.findAll({
    where: { organisationId: actor.organisationId, status: "done", ...(opts.liftRevisionIds ? { liftRevisionId: { [Op.in]: opts.liftRevisionIds } } : {}) },
    order: [["id", "DESC"]],
    limit: opts.limit ?? 100,
    attributes: ["id", "scenarioId", "liftRevisionId", "inputs", "overrides", "startedBy", "finishedAt", "createdAt"],
  });
  if (!runs.length) return [];
  const ids = runs.map((r) => r.id);
  const [scenarios, users, cases, revisions] = await Promise.all([
    Scenario.findAll({ where: { organisationId: actor.organisationId, id: [...new Set(runs.map((r) => r.scenarioId))] }, attributes: ["id", "name"] }),
    User.findAll({ where: { organisationId: actor.organisationId, id: [...new Set(runs.map((r) => r.startedBy).filter((x): x is number => x !== null))] }, attributes: ["id", "name"] }),
    StudyCase.findAll({ where: { runId: ids }, attributes: ["runId", "studyId"] }),
    LiftRevision.findAll({ where: { id: [...new Set(runs.map((r) => r.liftRevisionId))] }, attributes: ["id", "number"] }),
  ]);
  const scenario = new Map(scenarios.map((s) => [s.id, s.name]));
  const user = new Map(users.map((u) => [u.id, u.name]));
  const studyOf = new Map(cases.map((c) => [c.runId, c.studyId]));
  const revision = new Map(revisions.map((v) => [v.id, v.number]));
  return runs.map((r) => {
    // Format 2 inputs list trains; a run stored before the migration may still hold format 1's one train.
    const inputs = r.inputs as { run?: { duration?: number }; trains?: { entrySpeed?: number }[]; train?: { entrySpeed?: number } };
    const entry = inputs.trains?.[0]?.entrySpeed ?? inputs.train?.entrySpeed;
    const parts = [
      `Run ${r.id}`,
      scenario.get(r.scenarioId) ?? "scenario",
      when(r.finishedAt ?? r.createdAt),
      entry !== undefined ? `entry ${formatQuantity(entry, "speed", opts.units)}` : null,
      whatIfText(r.overrides, opts.units),
      `revision ${revision.get(r.liftRevisionId) ?? "?"}`,
      r.startedBy ? (user.get(r.startedBy) ?? null) : null,
      studyOf.has(r.id) ? `case of study ${studyOf.get(r.id)}` : null,
    ];
    return { id: r.id, label: parts.filter(Boolean).join(" · "), duration: Number(inputs.run?.duration ?? 0) };
  });
}
