import crypto from "node:crypto";

/**
 * The address a request really came from, for per-address limits.
 *
 * `next start` hands route handlers no socket, and Next only fills X-Forwarded-For when the client sent
 * none, so that header is whatever the client wants. At start-up (instrumentation.ts) every incoming
 * request is stamped with its socket's address under a header name drawn at random for this process, so a
 * client cannot send it. Forwarding headers count only when that peer is a proxy named in TRUSTED_PROXIES
 * (comma-separated addresses, or `loopback`): then the nearest entry of X-Forwarded-For that is not itself
 * a trusted proxy is the client.
 */
type HeaderSource = Headers | Record<string, string | string[] | undefined>;

const STAMP = Symbol.for("tautline.peerHeader");
type Stamped = typeof globalThis & { [STAMP]?: string };

/** Stamps every request this process's HTTP servers receive with its socket address (idempotent). */
export async function installPeerStamp(): Promise<void> {
  const g = globalThis as Stamped;
  if (g[STAMP]) return;
  const name = `x-tautline-peer-${crypto.randomBytes(9).toString("hex")}`;
  g[STAMP] = name;
  const http = await import("node:http");
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function (this: unknown, event: string | symbol, ...args: unknown[]) {
    if (event === "request") {
      const req = args[0] as { headers: Record<string, string | string[] | undefined>; socket?: { remoteAddress?: string } };
      req.headers[name] = req.socket?.remoteAddress ?? "";
    }
    return (emit as (...a: unknown[]) => boolean).apply(this, [event, ...args]);
  } as typeof emit;
}

function getter(headers: HeaderSource) {
  return (name: string): string | undefined => {
    if (headers instanceof Headers) return headers.get(name) ?? undefined;
    const v = headers[name];
    return Array.isArray(v) ? v.join(",") : v;
  };
}

const LOOPBACK = new Set(["127.0.0.1", "::1", "::ffff:127.0.0.1"]);

/** The TRUSTED_PROXIES setting as a membership test. */
export function trustedProxies(env: Readonly<Record<string, string | undefined>> = process.env): (address: string) => boolean {
  const entries = (env.TRUSTED_PROXIES ?? "")
    .split(",")
    .map((s) => s.trim().toLowerCase())
    .filter(Boolean);
  return (address) => entries.some((e) => (e === "loopback" ? LOOPBACK.has(address) : e === address.toLowerCase()));
}

function forwardedFor(get: (n: string) => string | undefined): string[] {
  return (get("x-forwarded-for") ?? "")
    .split(",")
    .map((p) => p.trim())
    .filter(Boolean);
}

/**
 * The request's real client address. Without a stamped peer (a process where the stamp is not installed),
 * forwarding headers count only when TRUSTED_PROXIES is set; otherwise every such request shares "direct".
 */
export function clientAddress(headers: HeaderSource, env: Readonly<Record<string, string | undefined>> = process.env): string {
  const get = getter(headers);
  const trusted = trustedProxies(env);
  const stampName = (globalThis as Stamped)[STAMP];
  const peer = stampName ? get(stampName)?.trim() : undefined;
  const viaProxy = peer ? trusted(peer) : !!env.TRUSTED_PROXIES?.trim();
  if (peer && !viaProxy) return peer;
  if (viaProxy) {
    // Walk from the nearest hop outwards past our own proxies.
    const hops = forwardedFor(get);
    while (hops.length && trusted(hops[hops.length - 1])) hops.pop();
    const client = hops.pop() ?? get("x-real-ip")?.trim();
    if (client) return client;
  }
  return peer || "direct";
}

/**
 * The address the request says it came from (nearest X-Forwarded-For entry, else the real one). Forgeable
 * when no trusted proxy sits in front; used only to key a lockout that must not reach other people, never
 * for a limit an attacker would want to escape (those use clientAddress).
 */
export function claimedAddress(headers: HeaderSource, env: Readonly<Record<string, string | undefined>> = process.env): string {
  const get = getter(headers);
  return forwardedFor(get).pop() || get("x-real-ip")?.trim() || clientAddress(headers, env);
}
