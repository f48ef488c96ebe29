import { mkdtemp, readFile, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import nodemailer from "nodemailer";
import { afterAll, describe, expect, it } from "vitest";
import { startMailFake, type FakeMessage } from "@/lib/mail/fake-server";

const dirs: string[] = [];
afterAll(async () => {
  for (const d of dirs) await rm(d, { recursive: true, force: true });
});

describe("mail fake", () => {
  it("keeps every message in memory and on disk, lists it over HTTP, and deletes on request", async () => {
    const dir = await mkdtemp(path.join(os.tmpdir(), "tautline-fake-"));
    dirs.push(dir);
    const fake = await startMailFake({ smtpPort: 0, httpPort: 0, dir });
    const smtp = nodemailer.createTransport(`smtp://127.0.0.1:${fake.smtpPort}`);
    await smtp.sendMail({ from: "Tautline <no-reply@tautline.example>", to: "a@lanternfell.example", subject: "One", text: "first", html: "<p>first</p>" });
    await smtp.sendMail({ from: "no-reply@tautline.example", to: ["b@lanternfell.example", "c@cardlevane.example"], subject: "Two", text: "second" });

    const list = (await (await fetch(`http://127.0.0.1:${fake.httpPort}/messages`)).json()) as FakeMessage[];
    expect(list.map((m) => m.subject)).toEqual(["Two", "One"]);
    expect(list[0].to).toEqual(["b@lanternfell.example", "c@cardlevane.example"]);
    expect(list[1]).toMatchObject({ from: "no-reply@tautline.example", text: "first", html: "<p>first</p>" });
    expect(Date.parse(list[1].date)).not.toBeNaN();
    const onDisk = JSON.parse(await readFile(path.join(dir, "messages.json"), "utf8")) as FakeMessage[];
    expect(onDisk).toHaveLength(2);
    await fake.close();

    // A restart on the same folder keeps the messages; DELETE empties both.
    const again = await startMailFake({ smtpPort: 0, httpPort: 0, dir });
    const base = `http://127.0.0.1:${again.httpPort}`;
    expect(((await (await fetch(`${base}/messages`)).json()) as FakeMessage[]).length).toBe(2);
    expect((await fetch(`${base}/messages`, { method: "DELETE" })).status).toBe(200);
    expect(((await (await fetch(`${base}/messages`)).json()) as FakeMessage[]).length).toBe(0);
    expect(JSON.parse(await readFile(path.join(dir, "messages.json"), "utf8"))).toEqual([]);
    await again.close();
  });

  it("says which port is taken", async () => {
    const dir = await mkdtemp(path.join(os.tmpdir(), "tautline-fake-"));
    dirs.push(dir);
    const first = await startMailFake({ smtpPort: 0, httpPort: 0, dir });
    await expect(startMailFake({ smtpPort: 0, httpPort: first.httpPort, dir })).rejects.toThrow(
      new RegExp(`HTTP port ${first.httpPort} is already in use`),
    );
    await first.close();
  });
});
