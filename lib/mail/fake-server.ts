import { createServer, type IncomingMessage, type ServerResponse, type Server } from "node:http";
import { mkdir, readFile, rename, writeFile } from "node:fs/promises";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject } from "mailparser";

/** One message as the fake keeps it and serves it at GET /messages. */
export interface FakeMessage {
  id: string;
  to: string[];
  from: string;
  subject: string;
  text: string;
  html: string;
  date: string;
}

export interface MailFakeOptions {
  smtpPort: number;
  httpPort: number;
  /** Folder for messages.json; messages already there are loaded on start. */
  dir: string;
  host?: string;
  log?: (message: string) => void;
}

export interface MailFake {
  /** The ports actually bound (useful when 0 was asked for). */
  smtpPort: number;
  httpPort: number;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 5 * 1024 * 1024;

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(a) ? a : a ? [a] : [];
  return list.flatMap((x) => x.value.map((v) => v.address ?? "").filter(Boolean));
}

/**
 * A local stand-in for a mail provider: accepts every message over SMTP on loopback (no TLS, no auth),
 * keeps it in memory and in `dir/messages.json`, and serves the list over HTTP:
 * `GET /messages` (newest first) and `DELETE /messages` (`?id=…` repeated: only those).
 */
export async function startMailFake(opts: MailFakeOptions): Promise<MailFake> {
  const host = opts.host ?? "127.0.0.1";
  const log = opts.log ?? (() => {});
  const file = path.join(opts.dir, "messages.json");
  await mkdir(opts.dir, { recursive: true });
  let messages: FakeMessage[] = await readFile(file, "utf8")
    .then((t) => JSON.parse(t) as FakeMessage[])
    .catch(() => []);

  // Writes are serialised so concurrent deliveries never interleave in the file.
  let writing: Promise<void> = Promise.resolve();
  const persist = () => {
    writing = writing.then(async () => {
      const tmp = `${file}.${process.pid}.tmp`;
      await writeFile(tmp, JSON.stringify(messages, null, 2));
      await rename(tmp, file);
    });
    return writing;
  };

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: "Tautline mail fake",
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
          const msg: FakeMessage = {
            id: randomUUID(),
            to: envelopeTo.length ? envelopeTo : addresses(parsed.to),
            from: addresses(parsed.from)[0] ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ""),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : "",
            date: (parsed.date ?? new Date()).toISOString(),
          };
          messages = [msg, ...messages];
          await persist();
          log(`mail fake: kept "${msg.subject}" to ${msg.to.join(", ")}`);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });

  const http = createServer((req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? "/", "http://localhost");
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { "content-type": "application/json; charset=utf-8", "cache-control": "no-store" });
      res.end(JSON.stringify(body));
    };
    if (url.pathname === "/messages" && req.method === "GET") return send(200, messages);
    if (url.pathname === "/messages" && req.method === "DELETE") {
      // ?id=…&id=… deletes those messages only; no id deletes all.
      const ids = new Set(url.searchParams.getAll("id"));
      messages = ids.size ? messages.filter((m) => !ids.has(m.id)) : [];
      persist().then(
        () => send(200, { deleted: true }),
        (err: Error) => send(500, { error: err.message }),
      );
      return;
    }
    if (url.pathname === "/health") return send(200, { ok: true, count: messages.length });
    send(404, { error: "Use GET /messages or DELETE /messages." });
  });

  await listen(smtp.server as unknown as Server, opts.smtpPort, host, "SMTP");
  try {
    await listen(http, opts.httpPort, host, "HTTP");
  } catch (err) {
    await new Promise<void>((r) => smtp.close(() => r()));
    throw err;
  }
  const smtpPort = (smtp.server.address() as { port: number }).port;
  const httpPort = (http.address() as { port: number }).port;
  log(`mail fake: SMTP on ${host}:${smtpPort}, messages at http://${host}:${httpPort}/messages`);

  return {
    smtpPort,
    httpPort,
    async close() {
      await Promise.all([
        new Promise<void>((r) => smtp.close(() => r())),
        new Promise<void>((r) => {
          http.closeAllConnections?.();
          http.close(() => r());
        }),
      ]);
      await writing;
    },
  };
}

function listen(server: Server, port: number, host: string, what: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => {
      server.off("listening", onListening);
      reject(
        new Error(
          err.code === "EADDRINUSE"
            ? `The mail fake's ${what} port ${port} is already in use on ${host}.`
            : `The mail fake's ${what} server could not start on ${host}:${port}: ${err.message}`,
        ),
      );
    };
    const onListening = () => {
      server.off("error", onError);
      resolve();
    };
    server.once("error", onError);
    server.once("listening", onListening);
    server.listen(port, host);
  });
}
