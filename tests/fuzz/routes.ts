import fs from "node:fs";
import path from "node:path";
import { API_ROUTES, METHODS, patternFromFile, type Method, type RowSource } from "@/lib/auth/route-access";

/** A route handler found under app/, with the methods its file exports. */
export interface FoundRoute {
  pattern: string;
  file: string;
  methods: Method[];
  rows?: Record<string, RowSource>;
  probeBody?: unknown;
  skipProbe?: boolean;
}

const APP = path.join(process.cwd(), "app");

export function exportedMethods(file: string): Method[] {
  const src = fs.readFileSync(file, "utf8");
  const names = new Set<string>();
  for (const m of src.matchAll(/export\s+(?:const|let|async\s+function|function)\s+([A-Z]+)\b/g)) names.add(m[1]);
  for (const m of src.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(",")) names.add(part.trim().split(/\s+as\s+/).pop()!.trim());
  }
  return METHODS.filter((m) => names.has(m));
}

/** Every app/**\/route.ts, discovered on disk (not a hand list), with its access-table entry when it has one. */
export function discoverRoutes(): FoundRoute[] {
  const found: FoundRoute[] = [];
  for (const rel of fs.readdirSync(APP, { recursive: true }) as string[]) {
    if (path.basename(rel) !== "route.ts") continue;
    const pattern = patternFromFile(rel);
    const file = path.join(APP, rel);
    const entry = API_ROUTES[pattern];
    found.push({ pattern, file, methods: exportedMethods(file), rows: entry?.rows, probeBody: entry?.probeBody, skipProbe: entry?.skipProbe });
  }
  return found.sort((a, b) => a.pattern.localeCompare(b.pattern));
}

export const WRITE_METHODS: Method[] = ["POST", "PUT", "PATCH", "DELETE"];
