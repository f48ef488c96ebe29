// Bundles the engine worker (lib/engine/worker.ts and the engine it imports) into one plain JavaScript
// file that Node worker threads can load: Next's production build cannot hand a .ts file to a worker.
// Run by `npm run build` before `next build`, and on demand by lib/jobs/worker-bundle.ts in dev and tests.
// Usage: node lib/jobs/build-worker.mjs [outfile]
import { build } from "esbuild";
import { renameSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const DEFAULT_OUTFILE = path.join(root, ".data", "build", "run-worker.mjs");

/** The `@/` import alias of the project, resolved like tsconfig's paths (minus its odex type stub). */
const rootAlias = {
  name: "root-alias",
  setup(b) {
    b.onResolve({ filter: /^@\// }, (args) =>
      b.resolve("./" + args.path.slice(2), { resolveDir: root, kind: args.kind, importer: args.importer }),
    );
  },
};

export async function buildWorker(outfile = DEFAULT_OUTFILE) {
  const started = Date.now();
  // Write beside the target and rename: several test processes may build at once, and a worker thread
  // must never load a half-written file.
  const tmp = `${outfile}.${process.pid}.tmp`;
  await build({
    // The pool's worker-thread entry: the engine side of the jobs, outside lib/jobs (which knows no domain).
    entryPoints: [path.join(root, "lib", "engine", "worker.ts")],
    outfile: tmp,
    bundle: true,
    platform: "node",
    target: "node20",
    format: "esm",
    logLevel: "warning",
    // tsconfig.json maps `odex` to a declaration file for the type checker; the bundle needs the real package.
    tsconfigRaw: { compilerOptions: { strict: true } },
    plugins: [rootAlias],
    // CommonJS dependencies (odex) may call require(); give the ES module bundle one.
    banner: { js: "import { createRequire as __tautlineRequire } from 'node:module'; const require = __tautlineRequire(import.meta.url);" },
  });
  renameSync(tmp, outfile);
  return { outfile, ms: Date.now() - started };
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const out = process.argv[2] ? path.resolve(process.argv[2]) : DEFAULT_OUTFILE;
  buildWorker(out).then(
    ({ outfile, ms }) => console.log(`run worker bundled: ${path.relative(root, outfile)} (${ms} ms)`),
    (err) => {
      console.error(err);
      process.exit(1);
    },
  );
}
