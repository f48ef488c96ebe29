import fc from "fast-check";

/** One malformed request. `field` is the path the answer must name when it is a 400 about a field. */
export interface FuzzCase {
  kind: string;
  url: string;
  method: string;
  headers: Record<string, string>;
  body?: string | Buffer;
  field?: string;
  /** Sent as a stream without Content-Length (Transfer-Encoding: chunked), this many bytes. */
  chunkedBytes?: number;
}

const INF = "\u0000INF\u0000";
const NEG_INF = "\u0000NEGINF\u0000";

/** JSON text in which the markers become 1e999 / -1e999: JSON.parse reads them as ±Infinity. */
function jsonText(value: unknown): string {
  return JSON.stringify(value).replaceAll(JSON.stringify(INF), "1e999").replaceAll(JSON.stringify(NEG_INF), "-1e999");
}

type Leaf = { path: (string | number)[]; value: unknown };

function leaves(value: unknown, at: (string | number)[] = [], out: Leaf[] = []): Leaf[] {
  if (Array.isArray(value)) {
    value.slice(0, 3).forEach((v, i) => leaves(v, [...at, i], out));
    if (value.length === 0 && at.length) out.push({ path: at, value });
  } else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) leaves(v, [...at, k], out);
  } else if (at.length) {
    out.push({ path: at, value });
  }
  return out;
}

function setAt(base: unknown, p: (string | number)[], v: unknown): unknown {
  const copy = structuredClone(base) as Record<string | number, unknown>;
  let node = copy;
  for (const k of p.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
  node[p[p.length - 1]] = v;
  return copy;
}

function deleteAt(base: unknown, p: (string | number)[]): unknown {
  const copy = structuredClone(base) as Record<string | number, unknown>;
  let node = copy;
  for (const k of p.slice(0, -1)) node = node[k] as Record<string | number, unknown>;
  if (Array.isArray(node)) node.splice(Number(p[p.length - 1]), 1);
  else delete node[p[p.length - 1]];
  return copy;
}

/** Values of a type the field cannot have (never null: a nullable field may take it). */
function wrongTypes(v: unknown): unknown[] {
  if (typeof v === "number") return ["12 kg", "", true, [v], { value: v }];
  if (typeof v === "string") return [12345, false, [v], { text: v }];
  if (typeof v === "boolean") return ["yes", 1, [v]];
  if (Array.isArray(v)) return ["not a list", 7, { 0: v[0] }];
  return ["x", 1];
}

/** Values of the right type but out of physical range for a field named like this. */
function hostileNumbers(key: string): unknown[] {
  const out: unknown[] = [INF, NEG_INF, 1e308, -1e308];
  if (/mass|stiffness|pitch|strength|length|cars|segments|duration|speed|tolerance|area/i.test(key)) out.push(-1, -1e-9);
  if (/angle|slope|incline/i.test(key)) out.push(1000, -720);
  return out;
}

const CONTROL = ["\u0000", "\u0007bell", "a\u001b[31mred", "tab\there", "line\nbreak", "\u007f", "\u0085next"];
// Refused in every text field, free text included (which keeps tab and line breaks).
const CONTROL_ANYWHERE = ["nul\u0000here", "esc\u001b[2Jclear"];
// Lone UTF-16 surrogates: JSON can carry them (as \ud800 escapes), MariaDB's utf8mb4 cannot store them.
const LONE_SURROGATES = ["a\ud800b", "\udc00", "end\ud83c"];
// Fields that name one line of text: every control character is refused there.
const ONE_LINE = /name|designation|title|caption|site|lubricant/i;
// Dates that are not dates: a number, a boolean, SQL-looking text, a year past 9999, a day that does not exist.
const NON_DATES: unknown[] = [-8.64e15, true, "1; DROP TABLE lifts", "2001 OR 1=1", "275760-09-13", "2026-02-30", ""];
// Write routes whose body takes an optional date the base body may leave out: [url pattern, field].
const DATE_FIELDS: [RegExp, string][] = [[/\/api\/logbook\/entries$/, "measuredAt"]];

/**
 * Every malformed request for one write route: generic ones (content type, broken JSON, size, shapes),
 * one per mutated leaf of a base body (wrong types, ±Infinity, huge and negative numbers, control
 * characters in text, a removed field) and `randomCount` more drawn by fast-check from `seed`.
 * `inputKeys` are the field names the zod schemas declare: only those leaves are mutated.
 */
export function casesFor(
  method: string,
  url: string,
  base: unknown,
  inputKeys: Set<string>,
  seed: number,
  randomCount: number,
): FuzzCase[] {
  const json = { "content-type": "application/json" };
  const cases: FuzzCase[] = [];
  const add = (kind: string, body: string | Buffer | undefined, headers: Record<string, string> = json, field?: string) =>
    cases.push({ kind, url, method, headers, body, field });
  const baseText = JSON.stringify(base ?? {});

  add("content type text/plain", baseText, { "content-type": "text/plain" });
  add("content type form", "name=x&version=1", { "content-type": "application/x-www-form-urlencoded" });
  add("content type xml", "<lift><name>x</name></lift>", { "content-type": "application/xml" });
  add("no content type", baseText, {});
  // (No "empty body" case: some routes take an optional body, e.g. starting a run with the scenario's own settings.)
  for (const broken of ["{", '{"name":', "[1,2", "nul", "{'name':1}", '{"a":1,}', "NaN", '{"x": NaN}', '{"x": Infinity}', "\ufeff{}", "\u0000"]) {
    add(`broken JSON ${JSON.stringify(broken)}`, broken);
  }
  add("oversized body (1.2 MB)", JSON.stringify({ name: "x".repeat(1_200_000) }));
  add("oversized body (5 MB)", Buffer.alloc(5_000_000, 0x61));
  for (const shape of ["null", "[]", '"text"', "42", "true", "[{}]"]) add(`body is ${shape}`, shape);
  add("deep nesting", "[".repeat(4000) + "]".repeat(4000));
  add("deep object nesting", '{"a":'.repeat(2000) + "1" + "}".repeat(2000));

  const targets = leaves(base).filter((l) => l.path.some((k) => typeof k === "string" && inputKeys.has(k)));
  for (const leaf of targets) {
    const field = leaf.path.join(".");
    const key = String([...leaf.path].reverse().find((k) => typeof k === "string"));
    for (const w of wrongTypes(leaf.value)) add(`wrong type at ${field}`, jsonText(setAt(base, leaf.path, w)), json, field);
    if (typeof leaf.value === "number") {
      for (const h of hostileNumbers(key)) add(`hostile number ${String(h).replace(/\u0000/g, "")} at ${field}`, jsonText(setAt(base, leaf.path, h)), json, field);
    }
    if (typeof leaf.value === "string") {
      add(`huge text at ${field}`, jsonText(setAt(base, leaf.path, "é".repeat(70_000))), json, field);
      for (const c of ONE_LINE.test(key) ? [...CONTROL, ...CONTROL_ANYWHERE] : CONTROL_ANYWHERE) {
        add(`control characters at ${field}`, jsonText(setAt(base, leaf.path, `Lift ${c}`)), json, field);
      }
      for (const lone of LONE_SURROGATES) add(`lone surrogate at ${field}`, jsonText(setAt(base, leaf.path, lone)), json, field);
      if (key === "csv") {
        // Readings that overflow once converted to SI (1e308 lbf is Infinity in newtons), or whose
        // difference from the first reading does.
        const header = leaf.value.split(/\r?\n/)[0] ?? "";
        const width = header.split(",").length;
        const rows = [Array(width).fill("0").join(","), Array(width).fill("1e308").join(","), ["0.2", ...Array(width - 1).fill("-1e308")].join(",")];
        const withLbf = setAt(base, leaf.path, [header, ...rows].join("\n"));
        const units = (withLbf as { units?: Record<string, unknown> }).units;
        add(`values overflowing after conversion at ${field}`, jsonText(units ? { ...(withLbf as object), units: { ...units, force: "lbf", length: "ft" } } : withLbf));
      }
    }
    if (DATE_FIELDS.some(([, name]) => name === key)) {
      for (const d of NON_DATES) add(`non-date ${JSON.stringify(d)} at ${field}`, jsonText(setAt(base, leaf.path, d)), json, field);
    }
  }
  const isObject = base !== null && typeof base === "object" && !Array.isArray(base);
  for (const [pattern, field] of DATE_FIELDS) {
    if (!isObject || !pattern.test(new URL(url, "http://x").pathname) || field in (base as object)) continue;
    for (const d of NON_DATES) add(`non-date ${JSON.stringify(d)} at ${field}`, jsonText({ ...(base as object), [field]: d }), json, field);
  }
  // Bodies without Content-Length (chunked): refused once past the limit, not read whole first.
  cases.push({ kind: "chunked body without Content-Length (3 MB)", url, method, headers: json, chunkedBytes: 3_000_000 });
  cases.push({ kind: "chunked broken JSON without Content-Length", url, method, headers: json, chunkedBytes: 2_000 });
  // Structural damage on the top level: an extra field of the wrong kind combined with a removed one.
  const top = targets.filter((l) => l.path.length === 1);
  top.slice(0, 6).forEach((leaf, i) => {
    const other = top[(i + 1) % top.length];
    if (other === leaf) return;
    const damaged = setAt(deleteAt(base, leaf.path), other.path, wrongTypes(other.value)[0]) as object;
    add(`missing ${leaf.path.join(".")} + extra field + wrong type at ${other.path.join(".")}`, jsonText({ ...damaged, $where: "1", constructor: { prototype: { admin: true } } }), json, other.path.join("."));
  });

  // Random bodies from fast-check: a random leaf gets a random value of another type, or the body is random.
  if (randomCount > 0) {
    const anyValue = fc.oneof(fc.string({ unit: "binary", maxLength: 40 }), fc.integer(), fc.double(), fc.boolean(), fc.array(fc.integer(), { maxLength: 4 }), fc.dictionary(fc.string({ maxLength: 6 }), fc.string({ maxLength: 6 }), { maxKeys: 3 }));
    const sameType = (a: unknown, b: unknown) => typeof a === typeof b && Array.isArray(a) === Array.isArray(b);
    const draws = fc.sample(fc.tuple(fc.nat(), anyValue, fc.boolean(), fc.jsonValue({ maxDepth: 3 })), { seed, numRuns: randomCount * 3 });
    let made = 0;
    for (const [i, value, replaceBody, randomBody] of draws) {
      if (made >= randomCount) break;
      if (replaceBody || targets.length === 0) {
        // A random JSON value that is not an object: never a valid body for these routes.
        if (randomBody && typeof randomBody === "object" && !Array.isArray(randomBody)) continue;
        add("random non-object body", JSON.stringify(randomBody ?? null));
      } else {
        const leaf = targets[i % targets.length];
        if (sameType(value, leaf.value) || value === null) continue;
        if (typeof leaf.value === "number" && typeof value === "string" && value.trim() !== "" && Number.isFinite(Number(value))) continue;
        add(`random value at ${leaf.path.join(".")}`, jsonText(setAt(base, leaf.path, value)), json, leaf.path.join("."));
      }
      made += 1;
    }
  }
  return cases;
}

/** Bad values for a dynamic segment ([id], [number]…): never a row that exists. */
export const BAD_SEGMENTS = ["abc", "-1", "0", "1.5", "1e309", "99999999999999999999999", "NaN", "%00", "%F0%9F%8E%A2", "1%20OR%201=1", "..%2F..%2Fetc%2Fpasswd", "4294967296"];
