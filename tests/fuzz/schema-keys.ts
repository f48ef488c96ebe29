import fs from "node:fs";
import path from "node:path";

/**
 * Field names the input schemas declare, read from the zod schemas in the code: every module under lib/
 * and sim/ whose name says it holds schemas is imported and each exported zod schema walked. The fuzzer
 * mutates only leaves whose key is one of these, so a mutation always lands on a field some schema reads
 * (output-only fields such as ids and timestamps would be ignored, not refused).
 */
export async function inputFieldNames(): Promise<Set<string>> {
  const keys = new Set<string>();
  const files: string[] = [];
  for (const dir of ["lib", "sim"]) {
    for (const rel of fs.readdirSync(path.join(process.cwd(), dir), { recursive: true }) as string[]) {
      if (/(^|[\\/])schemas?\.ts$/.test(rel)) files.push(path.join(process.cwd(), dir, rel));
    }
  }
  for (const file of files) {
    let mod: Record<string, unknown>;
    try {
      mod = (await import(file)) as Record<string, unknown>;
    } catch {
      continue; // a module that needs the server runtime: its keys are covered by the others
    }
    for (const value of Object.values(mod)) walk(value, keys, new Set());
  }
  return keys;
}

type Def = { type?: string; shape?: Record<string, unknown>; innerType?: unknown; element?: unknown; options?: unknown[]; in?: unknown; out?: unknown; schema?: unknown; left?: unknown; right?: unknown };

function walk(schema: unknown, keys: Set<string>, seen: Set<unknown>): void {
  if (!schema || typeof schema !== "object" || seen.has(schema)) return;
  seen.add(schema);
  const def = (schema as { _zod?: { def?: Def } })._zod?.def;
  if (!def) return;
  if (def.shape) {
    for (const [k, v] of Object.entries(def.shape)) {
      keys.add(k);
      walk(v, keys, seen);
    }
  }
  for (const child of [def.innerType, def.element, def.in, def.out, def.schema, def.left, def.right, ...(def.options ?? [])]) walk(child, keys, seen);
}
