// Database fault test: SIGKILLs its OWN MariaDB (never the shared test database) in the middle of a burst
// of writes through the API, restarts it, and checks that every write answered 2xx is stored whole, that
// during the outage the API answers 503 + Retry-After with a clear message without hanging, and that it
// recovers by itself within 10 s of the database answering again.
// Run: npx tsx tests/reliability/db-fault.ts (npm test runs it after e2e). Ports: FAULT_DB_PORT, FAULT_APP_PORT.
// Needs a production build (.next). Prints one JSON line of figures; exit code 0 only when every check passed.
import fs from "node:fs";
import mariadb from "mariadb";
import { DEMO_ACCOUNTS } from "../../lib/auth/demo-accounts";
import { trainInputSchema } from "../../lib/trains/schema";
import { scenarioInputSchema } from "../../lib/scenarios/schema";
import { instancePaths, startDatabase } from "../../scripts/lib/mariadb";
import { Client, sleep } from "./http-client";
import { startPrivateStack, type PrivateStack } from "./stack";

const DB_PORT = Number(process.env.FAULT_DB_PORT ?? 3327);
const APP_PORT = Number(process.env.FAULT_APP_PORT ?? 3127);
const WRITERS = 4;
const BURST_BEFORE_KILL_MS = 1500;
const OUTAGE_MS = 4000;
const ANSWER_LIMIT_MS = 8000; // "never hangs": every answer during the outage within this
const RECOVERY_LIMIT_MS = 10_000;

type Written = { kind: "train" | "scenario" | "run"; id: number; name?: string };

function pick(obj: Record<string, unknown>, keys: string[]): Record<string, unknown> {
  return Object.fromEntries(keys.filter((k) => obj[k] !== undefined).map((k) => [k, obj[k]]));
}

async function main(): Promise<boolean> {
  const failures: string[] = [];
  const figures: Record<string, unknown> = {};
  let stack: PrivateStack | null = null;
  try {
    // Served as production behind TLS would be (NEXTAUTH_URL https): the session cookie must then be Secure.
    stack = await startPrivateStack(DB_PORT, APP_PORT, { JOB_QUEUE_MAX: "64", NEXTAUTH_URL: `https://127.0.0.1:${APP_PORT}` });
    const admin = DEMO_ACCOUNTS.find((a) => a.organisation === "lanternfell" && a.role === "admin")!;
    const api = new Client(stack.appUrl);
    await api.signIn(admin.email);
    const session = api.setCookies.find((c) => c.includes("next-auth.session-token="));
    figures.productionSessionCookie = session?.replace(/=[^;]+/, "=…");
    if (!session || !/^__Secure-/.test(session) || !/;\s*Secure/i.test(session) || !/;\s*HttpOnly/i.test(session) || !/;\s*SameSite=Lax/i.test(session)) {
      failures.push(`production session cookie lacks __Secure-/Secure/HttpOnly/SameSite=Lax: ${session}`);
    }

    // Valid bodies made from the demo park's own rows, limited to the fields the input schemas take.
    const trainList = (await (await api.fetch("/api/trains")).json()) as { items: { id: number }[] };
    const train = (await (await api.fetch(`/api/trains/${trainList.items[0].id}`)).json()) as Record<string, unknown>;
    const trainBody = pick(train, Object.keys(trainInputSchema.shape));
    const scenList = (await (await api.fetch("/api/scenarios")).json()) as { items: { id: number }[] };
    const scenario = (await (await api.fetch(`/api/scenarios/${scenList.items[0].id}`)).json()) as Record<string, unknown>;
    const scenarioBody = pick(scenario, Object.keys(scenarioInputSchema.shape));
    delete scenarioBody.liftRevisionId;

    const written: Written[] = [];
    const outage: { status: number; ms: number; retryAfter: string | null; message: string }[] = [];
    const other: string[] = [];
    let phase: "before" | "outage" | "after" = "before";
    let stop = false;
    let n = 0;

    async function writer(w: number): Promise<void> {
      while (!stop) {
        const i = n++;
        const kind = i % 5 === 4 ? "run" : i % 2 === 0 ? "train" : "scenario";
        const name = `Fault burst ${kind} ${w}-${i}`;
        const t0 = Date.now();
        let res: Response;
        try {
          res =
            kind === "train"
              ? await api.json("/api/trains", "POST", { ...trainBody, name })
              : kind === "scenario"
                ? await api.json("/api/scenarios", "POST", { ...scenarioBody, name })
                : await api.json(`/api/scenarios/${scenList.items[0].id}/runs`, "POST", { duration: 2, frameBudget: 20 });
        } catch (err) {
          other.push(`${kind} during ${phase}: no answer within ${Date.now() - t0} ms (${(err as Error).message})`);
          continue;
        }
        const ms = Date.now() - t0;
        const at = phase; // when the answer came: a write in flight at the kill may rightly get a 503
        const body = (await res.json().catch(() => ({}))) as { id?: number; run?: { id: number }; error?: string };
        if (res.status >= 200 && res.status < 300) {
          const id = kind === "run" ? (body.run?.id ?? body.id) : body.id;
          if (typeof id !== "number") other.push(`${kind}: ${res.status} without an id`);
          else written.push({ kind, id, name: kind === "run" ? undefined : name });
        } else if (res.status === 503) {
          if (at === "outage") outage.push({ status: 503, ms, retryAfter: res.headers.get("retry-after"), message: body.error ?? "" });
          else if (kind !== "run") other.push(`${kind} during ${at}: 503 ${body.error}`); // a run may meet a full queue
        } else {
          other.push(`${kind} during ${at}: ${res.status} ${JSON.stringify(body).slice(0, 200)}`);
        }
        if (phase === "outage") await sleep(100);
      }
    }

    const writers = Array.from({ length: WRITERS }, (_, w) => writer(w));
    await sleep(BURST_BEFORE_KILL_MS);
    // The lift list as it stood before the kill: nothing can change it while the database is down, so
    // the one answer allowed besides a 503 is this same list from the app's memory (lib/http/read-cache.ts),
    // before the app has noticed the loss. Once noticed, the cache stands aside and reads answer 503.
    const listBeforeKill = await (await api.fetch("/api/lifts")).text();
    const paths = instancePaths(stack.dataDir);
    const pid = Number(fs.readFileSync(paths.pidFile, "utf8").trim());
    process.kill(pid, "SIGKILL");
    phase = "outage";
    const killedAt = Date.now();
    figures.writesBeforeKill = written.length;
    // Reads during the outage too: they must answer 503 quickly, not hang.
    const reads: number[] = [];
    let fromMemory = 0;
    let unavailableReads = 0;
    while (Date.now() - killedAt < OUTAGE_MS) {
      const t0 = Date.now();
      try {
        const res = await api.fetch("/api/lifts", { timeoutMs: ANSWER_LIMIT_MS });
        reads.push(Date.now() - t0);
        const text = await res.text();
        if (res.status === 503) unavailableReads += 1;
        else if (res.status === 200 && text === listBeforeKill) fromMemory += 1;
        else other.push(`read during outage: ${res.status} ${text.slice(0, 200)}`);
      } catch {
        other.push(`read during outage: no answer within ${ANSWER_LIMIT_MS} ms`);
      }
      await sleep(200);
    }
    // Bring the database back (same data dir: InnoDB crash recovery), then time the API's own recovery.
    await startDatabase({ dataDir: stack.dataDir, config: stack.db });
    const dbBackAt = Date.now();
    phase = "after";
    let recoveredMs = -1;
    while (Date.now() - dbBackAt < RECOVERY_LIMIT_MS + 5_000) {
      try {
        const res = await api.fetch("/api/lifts", { timeoutMs: 3_000 });
        if (res.status === 200) {
          recoveredMs = Date.now() - dbBackAt;
          break;
        }
      } catch {
        // keep polling
      }
      await sleep(100);
    }
    await sleep(1500); // a few writes after recovery
    stop = true;
    await Promise.all(writers);

    figures.outageAnswers = outage.length;
    figures.outageReads = { unavailable503: unavailableReads, sameListFromMemory: fromMemory };
    if (unavailableReads === 0) other.push("no read during the outage answered 503");
    figures.outageMaxMs = Math.max(0, ...outage.map((o) => o.ms), ...reads);
    figures.recoveredMs = recoveredMs;
    figures.writesAnswered2xx = written.length;
    if (outage.length + reads.length === 0) failures.push("no request was answered during the outage");
    for (const o of outage.filter((o) => !o.retryAfter || !/database/i.test(o.message))) {
      failures.push(`outage answer without Retry-After or a clear message: ${JSON.stringify(o)}`);
    }
    if ((figures.outageMaxMs as number) > ANSWER_LIMIT_MS) failures.push(`an answer during the outage took ${figures.outageMaxMs} ms`);
    if (recoveredMs < 0 || recoveredMs > RECOVERY_LIMIT_MS) failures.push(`the API did not recover within ${RECOVERY_LIMIT_MS} ms of the database (${recoveredMs} ms)`);
    failures.push(...other.slice(0, 20));

    // Wait for runs to settle, then check what is stored.
    const conn = await mariadb.createConnection({ host: stack.db.host, port: stack.db.port, user: stack.db.user, password: stack.db.password, database: stack.db.database });
    try {
      const settle = Date.now();
      while (Date.now() - settle < 20_000) {
        const [r] = (await conn.query("SELECT COUNT(*) AS n FROM runs WHERE status IN ('queued','running')")) as { n: bigint }[];
        if (Number(r.n) === 0) break;
        await sleep(500);
      }
      let missing = 0;
      for (const w of written) {
        const table = w.kind === "train" ? "trains" : w.kind === "scenario" ? "scenarios" : "runs";
        const rows = (await conn.query(`SELECT id${w.name ? ", name" : ""} FROM ${table} WHERE id = ?`, [w.id])) as { name?: string }[];
        if (!rows.length || (w.name && rows[0].name !== w.name)) {
          missing += 1;
          failures.push(`${w.kind} ${w.id} was answered 2xx but is ${rows.length ? "different" : "missing"}`);
        }
        const audit = (await conn.query("SELECT COUNT(*) AS n FROM audit_entries WHERE entity = ? AND entity_id = ? AND action = 'create'", [w.kind, String(w.id)])) as { n: bigint }[];
        if (Number(audit[0].n) !== 1) failures.push(`${w.kind} ${w.id}: ${audit[0].n} create audit entries (expected 1, written in the same transaction)`);
      }
      figures.missing = missing;
      // Half-written rows: a row without its audit entry, a run without inputs, a run stuck in flight.
      const orphanTrains = (await conn.query(
        "SELECT COUNT(*) AS n FROM trains t WHERE t.name LIKE 'Fault burst%' AND NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity = 'train' AND a.entity_id = CAST(t.id AS CHAR) AND a.action = 'create')",
      )) as { n: bigint }[];
      const orphanScenarios = (await conn.query(
        "SELECT COUNT(*) AS n FROM scenarios s WHERE s.name LIKE 'Fault burst%' AND NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity = 'scenario' AND a.entity_id = CAST(s.id AS CHAR) AND a.action = 'create')",
      )) as { n: bigint }[];
      const badRuns = (await conn.query("SELECT id, status, error_code FROM runs WHERE inputs IS NULL OR status IN ('queued','running') OR (status = 'done' AND result IS NULL)")) as unknown[];
      figures.halfWritten = Number(orphanTrains[0].n) + Number(orphanScenarios[0].n) + badRuns.length;
      if (Number(orphanTrains[0].n)) failures.push(`${orphanTrains[0].n} train(s) without their audit entry`);
      if (Number(orphanScenarios[0].n)) failures.push(`${orphanScenarios[0].n} scenario(s) without their audit entry`);
      if (badRuns.length) failures.push(`runs left half-done after the fault: ${JSON.stringify(badRuns).slice(0, 300)}`);
      const runStates = (await conn.query("SELECT status, error_code AS code, COUNT(*) AS n FROM runs GROUP BY status, error_code")) as { status: string; code: string | null; n: bigint }[];
      figures.runStates = runStates.map((r) => `${r.status}${r.code ? `/${r.code}` : ""}×${Number(r.n)}`).join(", ");
    } finally {
      await conn.end();
    }
  } catch (err) {
    failures.push(`fault test could not run: ${(err as Error).message}`);
    if (stack) console.error(stack.appLog.join("").slice(-3000));
  } finally {
    await stack?.stop();
  }
  console.log(`[fault] ${JSON.stringify(figures)}`);
  for (const f of failures) console.error(`[fault] FAIL ${f}`);
  console.log(`[fault] ${failures.length ? "FAILED" : "passed"}: ${failures.length} problem(s)`);
  return failures.length === 0;
}

main().then(
  (ok) => process.exit(ok ? 0 : 1),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
