import type { Transaction } from "sequelize";
import { crossFieldIssues } from "@/sim/schema";
import { getModels } from "@/models";
import { zodIssues, type FieldIssue } from "@/lib/http/errors";
import type { Actor } from "@/lib/http/actor";
import { throwIfIssues } from "@/lib/http/validate";
import { CHAIN_VALUE_FIELDS } from "@/lib/chains/schema";
import { liftChainInputSchema, liftRevisionSchema, SECTION_KEYS, type LiftRevisionData } from "./schema";

type Raw = Record<string, unknown>;

const isObject = (v: unknown): v is Raw => typeof v === "object" && v !== null && !Array.isArray(v);

/** A given section replaces field by field; an absent one keeps the current revision's. */
function mergeSection(given: unknown, current: unknown): unknown {
  if (given === undefined) return current;
  if (isObject(given) && isObject(current)) return { ...current, ...given };
  return given;
}

/**
 * Works out the chain section: copies the catalogue values when `chainSpecId` is given (the catalogue
 * entry must be the standard one or the organisation's own, and not archived), keeps typed-in values
 * otherwise, and keeps the current revision's chain when neither is given.
 */
async function assembleChain(
  actor: Actor,
  given: unknown,
  current: LiftRevisionData | null,
  issues: FieldIssue[],
  transaction?: Transaction,
): Promise<{ chain: unknown; chainSpecId: number | null; valuesMissing?: boolean }> {
  const currentChain = current?.chain as Raw | undefined;
  if (given === undefined) {
    if (current) return { chain: currentChain, chainSpecId: current.chainSpecId };
    issues.push({ path: "chain", message: "chain is required (section \"chain\")" });
    return { chain: undefined, chainSpecId: null };
  }
  if (!isObject(given)) return { chain: given, chainSpecId: null };
  const typed = liftChainInputSchema.safeParse(given);
  if (!typed.success) {
    // Only the chainSpecId type matters here; the section's own field rules run once, on the result.
    for (const i of zodIssues(typed.error)) if (i.path === "chainSpecId") issues.push({ path: "chain.chainSpecId", message: i.message });
  }
  const { chainSpecId, ...rest } = given as Raw & { chainSpecId?: unknown };
  const givesValues = CHAIN_VALUE_FIELDS.some((f) => rest[f] !== undefined);

  if (typeof chainSpecId === "number" && Number.isInteger(chainSpecId) && chainSpecId > 0) {
    if (givesValues) {
      issues.push({
        path: "chain.chainSpecId",
        message: "give either chain.chainSpecId (the catalogue's values are copied) or the chain's own pitch, massPerLength, axialStiffness and breakingStrength, not both",
      });
    }
    const { ChainSpec } = getModels();
    const spec = await ChainSpec.findByPk(chainSpecId, { transaction });
    if (!spec || (spec.organisationId !== null && spec.organisationId !== actor.organisationId)) {
      issues.push({ path: "chain.chainSpecId", message: `chain.chainSpecId ${chainSpecId}: no such chain in the catalogue` });
      return { chain: { ...currentChain, ...rest }, chainSpecId, valuesMissing: !currentChain };
    }
    if (spec.archivedAt) issues.push({ path: "chain.chainSpecId", message: `chain.chainSpecId ${chainSpecId}: that chain is archived` });
    const values = {
      pitch: spec.pitch,
      massPerLength: spec.massPerLength,
      axialStiffness: spec.axialStiffness,
      breakingStrength: spec.breakingStrength,
    };
    const routing = Object.fromEntries(Object.entries(rest).filter(([k]) => !(CHAIN_VALUE_FIELDS as readonly string[]).includes(k)));
    return { chain: { ...currentChain, ...routing, ...values }, chainSpecId };
  }
  if (chainSpecId === null || givesValues) {
    // Typed-in values: the revision no longer claims to come from a catalogue entry.
    if (!current && !givesValues) {
      issues.push({ path: "chain.chainSpecId", message: "choose a catalogue chain (chain.chainSpecId) or give the chain's own values" });
    }
    return { chain: { ...currentChain, ...rest }, chainSpecId: null };
  }
  if (!current) {
    issues.push({ path: "chain.chainSpecId", message: "choose a catalogue chain (chain.chainSpecId) or give the chain's own values" });
    return { chain: rest, chainSpecId: null };
  }
  return { chain: { ...currentChain, ...rest }, chainSpecId: current.chainSpecId };
}

/**
 * Builds and validates the data of a new revision from a request body and the current revision (null
 * when creating). Every problem is collected and thrown as one 400; nothing is written here.
 */
export async function buildRevisionData(
  actor: Actor,
  body: Raw,
  current: LiftRevisionData | null,
  transaction?: Transaction,
): Promise<LiftRevisionData> {
  const issues: FieldIssue[] = [];
  const pick = (k: "name" | "site" | "notes") => (k in body && body[k] !== undefined ? body[k] : current?.[k]);
  const { chain, chainSpecId, valuesMissing } = await assembleChain(actor, body.chain, current, issues, transaction);
  const candidate: Raw = { name: pick("name"), site: pick("site"), notes: pick("notes"), chainSpecId, chain };
  for (const key of SECTION_KEYS) {
    if (key === "chain") continue;
    candidate[key] = mergeSection(body[key], current?.[key]);
  }
  if (candidate.limits === undefined) candidate.limits = {};

  const parsed = liftRevisionSchema.safeParse(candidate);
  if (parsed.success && issues.length === 0) return parsed.data;
  const all = [...issues];
  const seen = new Set(all.map((i) => i.path));
  if (!parsed.success) {
    for (const i of zodIssues(parsed.error)) {
      if (i.path === "chainSpecId") continue; // reported above with its section path
      // The chain's values were to come from a catalogue entry that was not found: already reported.
      if (valuesMissing && CHAIN_VALUE_FIELDS.some((f) => i.path === `chain.${f}`)) continue;
      all.push(i);
      seen.add(i.path);
    }
    // zod skips the rules between fields when a field failed; run them on the raw data as well.
    for (const i of crossFieldIssues(candidate)) if (!seen.has(i.path)) all.push(i);
  }
  throwIfIssues(all);
  throw new Error("unreachable: revision data invalid without issues");
}
