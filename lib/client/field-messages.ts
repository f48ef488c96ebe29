/**
 * Form messages in words: the field's label and, for a bound, the bound in the reader's unit
 * ("Chain speed must be greater than 0 m/s"), never a dotted path. Built from the issues of the same zod
 * schema the server uses, and from the server's own issues when it answers 400.
 */
import { formatBound } from "./units";
import type { Quantity, UnitSystem } from "./units";

export interface FieldLabel {
  path: string;
  label: string;
  q?: Quantity;
  optional?: boolean;
}

interface IssueLike {
  path: ReadonlyArray<PropertyKey> | string;
  message: string;
  code?: string;
  minimum?: number | bigint;
  maximum?: number | bigint;
  inclusive?: boolean;
  expected?: string;
  origin?: string;
}

const pathText = (p: IssueLike["path"]) => (typeof p === "string" ? p : p.length ? p.map(String).join(".") : "(body)");

/** Replaces every known dotted path in a message with its label ("lift.chainTo" → "Chain ends at"). */
export function labelPaths(message: string, fields: readonly FieldLabel[]): string {
  const byLength = [...fields].sort((a, b) => b.path.length - a.path.length);
  let out = message;
  for (const f of byLength) {
    if (!f.path.includes(".") && !/^[a-z]+[A-Z]/.test(f.path)) continue;
    // Whole tokens only, and the engine's section prefix with them ("train.startPosition" → its label).
    const token = new RegExp(`(?<![\\w.])(?:[a-zA-Z]+\\.)*${f.path.replace(/\./g, "\\.")}(?![\\w.])`, "g");
    out = out.replace(token, f.label);
  }
  return out;
}

/** One issue in words for its field. */
export function issueWords(issue: IssueLike, field: FieldLabel | undefined, fields: readonly FieldLabel[], units: UnitSystem): string {
  const label = field?.label ?? "This value";
  const q = field?.q;
  const bound = (v: number | bigint | undefined) => formatBound(Number(v), q, units);
  if (issue.code === "too_small" && issue.origin === "number" && issue.minimum !== undefined)
    return `${label} must be ${issue.inclusive ? "at least" : "greater than"} ${bound(issue.minimum)}`;
  if (issue.code === "too_big" && issue.origin === "number" && issue.maximum !== undefined)
    return `${label} must be ${issue.inclusive ? "at most" : "less than"} ${bound(issue.maximum)}`;
  if (issue.code === "invalid_type" && (issue.expected === "int" || issue.expected === "number"))
    return issue.message.includes("required") || /received undefined/.test(issue.message)
      ? `${label} is required`
      : issue.expected === "int"
        ? `${label} must be a whole number`
        : `${label} must be a number`;
  return sentence(labelPaths(issue.message, fields), label, field?.path ?? pathText(issue.path));
}

/** A message that starts with its own path gets the label instead; one that names nothing gets the label in front. */
function sentence(message: string, label: string, path: string | undefined): string {
  if (path && message.startsWith(path)) return `${label}${message.slice(path.length)}`;
  if (message.startsWith(label)) return message;
  return `${label}: ${message}`;
}

/** Field path → first message in words, for every issue at once. */
export function fieldErrors(issues: readonly IssueLike[], fields: readonly FieldLabel[], units: UnitSystem): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) {
    const p = pathText(i.path);
    if (p in out) continue;
    out[p] = issueWords(i, fields.find((f) => f.path === p), fields, units);
  }
  return out;
}
