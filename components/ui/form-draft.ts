/** Small helpers shared by the forms: dotted paths into nested drafts, numeric field definitions. */
import type { NumberFieldDef } from "./NumberInput";

export type Draft = Record<string, unknown>;

export function getPath(obj: unknown, path: string): unknown {
  let cur: unknown = obj;
  for (const k of path.split(".")) {
    if (!cur || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[k];
  }
  return cur;
}

/** A copy of `obj` with `path` set (undefined removes the key). */
export function setPath<T extends Draft>(obj: T, path: string, value: unknown): T {
  const [head, ...rest] = path.split(".");
  const copy: Draft = { ...obj };
  if (rest.length === 0) {
    if (value === undefined) delete copy[head];
    else copy[head] = value;
  } else {
    const inner = (obj[head] && typeof obj[head] === "object" ? obj[head] : {}) as Draft;
    copy[head] = setPath(inner, rest.join("."), value);
  }
  return copy as T;
}

/** A numeric field of a design form (label, quantity, path in the draft). */
export type FieldDef = NumberFieldDef;
