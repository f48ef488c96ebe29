/**
 * Layers: pages, layouts, route handlers and components call lib/; only lib/ touches models/
 * (DEVELOPERS.md, "Folders and layers"). A static scan of every source file under app/ and components/.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = path.resolve(__dirname, "..", "..");
const MODELS = path.join(ROOT, "models");
const SOURCE = /\.(ts|tsx|js|jsx|mjs|cjs)$/;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return e.name === "node_modules" ? [] : sourceFiles(p);
    return SOURCE.test(e.name) ? [p] : [];
  });
}

// Every way a module names another: import … from "x", export … from "x", import "x", import("x"), require("x").
const SPECIFIER = /(?:\bfrom\s*|\bimport\s*\(?\s*|\brequire\s*\(\s*)["']([^"']+)["']/g;

/** The module specifiers of a file that lead into models/ (by the @/ alias or a relative path). */
function modelImports(file: string, text: string): string[] {
  return [...text.matchAll(SPECIFIER)]
    .map((m) => m[1]!)
    .filter((spec) => {
      if (spec === "@/models" || spec.startsWith("@/models/")) return true;
      if (!spec.startsWith(".")) return false;
      const target = path.resolve(path.dirname(file), spec);
      return target === MODELS || target.startsWith(MODELS + path.sep);
    });
}

describe("layers: only lib/ touches models/", () => {
  it("recognises every form of import into models/", () => {
    const page = path.join(ROOT, "app", "(workspace)", "x", "page.tsx");
    expect(modelImports(page, `import { getModels } from "@/models";`)).toEqual(["@/models"]);
    expect(modelImports(page, `import type { Run } from '@/models/Run';`)).toEqual(["@/models/Run"]);
    expect(modelImports(page, `export { getModels } from "@/models";`)).toEqual(["@/models"]);
    expect(modelImports(page, `const m = await import("@/models");`)).toEqual(["@/models"]);
    expect(modelImports(page, `import "../../../models/index";`)).toEqual(["../../../models/index"]);
    expect(modelImports(page, `import { recentRuns } from "@/lib/runs/recent";\nimport x from "./models";`)).toEqual([]);
  });

  it("no page, layout, route handler or component imports models/", () => {
    const files = [...sourceFiles(path.join(ROOT, "app")), ...sourceFiles(path.join(ROOT, "components"))];
    // The scan reads the real tree: pages, route handlers and components are all there.
    expect(files.some((f) => f.endsWith(path.join("app", "api", "runs", "[id]", "route.ts")))).toBe(true);
    expect(files.some((f) => f.endsWith(path.join("components", "dashboard", "RecentRuns.tsx")))).toBe(true);
    const offenders = files.flatMap((f) => modelImports(f, readFileSync(f, "utf8")).map((spec) => `${path.relative(ROOT, f)} imports "${spec}"`));
    expect(offenders).toEqual([]);
  });
});
