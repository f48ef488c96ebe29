/**
 * For the operations tests: a mail fake and an S3 fake of their own on free loopback ports (SMTP_URL and
 * S3_ENDPOINT point at them), a fresh organisation with one user per role, a lift from the example lift
 * hill and a short finished run of it. The database is the test database (DB_*), as in the design tests.
 */
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { startMailFake, type FakeMessage } from "@/lib/mail/fake-server";
import { startS3Fake } from "@/lib/storage/fake-server";
import { startRun } from "@/lib/runs/service";
import { finished, importForRuns, shortScenarioFile } from "./runs-fixtures";
import { makeOrganisation } from "./design-fixtures";
import type { Actor } from "@/lib/http/actor";

export async function opsFakes() {
  const dir = await mkdtemp(path.join(os.tmpdir(), "tautline-ops-"));
  const mail = await startMailFake({ smtpPort: 0, httpPort: 0, dir: path.join(dir, "mail") });
  const s3 = await startS3Fake({ port: 0, dir: path.join(dir, "s3"), bucket: "tautline-files" });
  process.env.SMTP_URL = `smtp://127.0.0.1:${mail.smtpPort}`;
  process.env.S3_ENDPOINT = `http://127.0.0.1:${s3.port}`;
  process.env.S3_BUCKET = "tautline-files";
  return {
    async messages(): Promise<FakeMessage[]> {
      return (await fetch(`http://127.0.0.1:${mail.httpPort}/messages`)).json() as Promise<FakeMessage[]>;
    },
    async close() {
      await mail.close();
      await s3.close();
      await rm(dir, { recursive: true, force: true });
    },
  };
}

/** An organisation with a lift (the example lift hill, imported with a scenario) and one finished short run. */
export async function opsWorld(tag: string, opts: { run?: boolean } = {}) {
  const org = await makeOrganisation(tag);
  const ids = await importForRuns(org.as.engineer, shortScenarioFile(`Ops ${tag}`, { duration: 8, segments: 12 }));
  let runId: number | null = null;
  if (opts.run) {
    const run = await startRun(org.as.engineer, ids.scenarioId, {});
    const row = await finished(run.id);
    if (row.status !== "done") throw new Error(`the fixture run ended ${row.status}`);
    runId = run.id;
  }
  return { ...org, ...ids, runId };
}

export type OpsWorld = Awaited<ReturnType<typeof opsWorld>> & { as: Record<string, Actor> };
