/**
 * What the sign-off tests share: an organisation with a mail fake for the review e-mails, finished runs to
 * report on, the text of a report's PDF, approval by the hash the approval summary shows, and the mailbox.
 */
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { PDFParse } from "pdf-parse";
import { closeJobPool } from "@/lib/jobs/pool";
import { startMailFake, type MailFake } from "@/lib/mail/fake-server";
import { getRun, startRun } from "@/lib/runs/service";
import { getReport } from "@/lib/reports/service";
import { approveReport } from "@/lib/review/service";
import type { Actor } from "@/lib/http/actor";
import { closeDb, makeOrganisation } from "./design-fixtures";
import { finished, importForRuns, shortScenarioFile } from "./runs-fixtures";

export interface SignoffEnv {
  org: Awaited<ReturnType<typeof makeOrganisation>>;
  engineer: Actor;
  reviewer: Actor;
  mail: MailFake;
  mailDir: string;
}

export interface Mail {
  to: string[];
  subject: string;
  text: string;
}

/** A new organisation (`tag` names it) and a mail fake the product sends its review e-mails to. */
export async function startSignoff(tag: string): Promise<SignoffEnv> {
  const org = await makeOrganisation(tag);
  const mailDir = await mkdtemp(path.join(os.tmpdir(), `tautline-${tag}-mail-`));
  const mail = await startMailFake({ smtpPort: 0, httpPort: 0, dir: mailDir });
  process.env.SMTP_URL = `smtp://127.0.0.1:${mail.smtpPort}`;
  return { org, engineer: org.as.engineer, reviewer: org.as.reviewer, mail, mailDir };
}

export async function stopSignoff(env: SignoffEnv): Promise<void> {
  await env.mail.close();
  await rm(env.mailDir, { recursive: true, force: true });
  await closeJobPool();
  await closeDb();
}

/** The text of a PDF, white space folded to single spaces. */
export async function pdfText(buf: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(buf) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

/** A short scenario imported for `actor` and one finished run of it. */
export async function finishedRunOf(actor: Actor, name: string) {
  const ids = await importForRuns(actor, shortScenarioFile(name, { duration: 8, segments: 16 }));
  const started = await startRun(actor, ids.scenarioId, {});
  await finished(started.id);
  return { ...ids, run: await getRun(actor, started.id) };
}

/** The content hash the approval summary shows: what a reviewer confirms by approving. */
export async function summaryHash(reviewer: Actor, reportId: number): Promise<string> {
  return (await getReport(reviewer, reportId)).approvalSummary!.contentHash;
}

/** Approves a report as its reviewer, confirming the hash the summary shows. */
export async function approveAsShown(reviewer: Actor, reportId: number, comment?: string) {
  return approveReport(reviewer, reportId, { ...(comment === undefined ? {} : { comment }), confirmedHash: await summaryHash(reviewer, reportId) });
}

/** The mails matching `pred`, polling the mail fake until one arrives or 5 s pass (then none). */
export async function mailTo(mail: MailFake, pred: (m: Mail) => boolean): Promise<Mail[]> {
  const until = Date.now() + 5000;
  for (;;) {
    const all = (await (await fetch(`http://127.0.0.1:${mail.httpPort}/messages`)).json()) as Mail[];
    const found = all.filter(pred);
    if (found.length || Date.now() > until) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
}
