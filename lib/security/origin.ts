import { HttpError } from "@/lib/http/errors";

const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Origins this deployment answers for: the request's own host, NEXTAUTH_URL and APP_ORIGINS (comma-separated). */
function allowedHosts(req: Request, env: NodeJS.ProcessEnv): Set<string> {
  const hosts = new Set<string>();
  const host = req.headers.get("x-forwarded-host")?.split(",")[0]?.trim() || req.headers.get("host")?.trim();
  if (host) hosts.add(host.toLowerCase());
  for (const url of [env.NEXTAUTH_URL, ...(env.APP_ORIGINS ?? "").split(",")]) {
    try {
      if (url?.trim()) hosts.add(new URL(url.trim()).host.toLowerCase());
    } catch {
      // a malformed setting allows nothing extra
    }
  }
  return hosts;
}

/**
 * A state-changing request from another site (a form or script on a page that is not Tautline's) is
 * refused before the handler runs. Browsers send `Origin` (and `Sec-Fetch-Site`) on every cross-origin
 * POST/PUT/PATCH/DELETE, so a request with neither comes from a tool (curl, scripts, tests), not from a
 * page a signed-in user happened to visit; the session cookie is also SameSite=Lax.
 */
export function crossSiteRefusal(req: Request, env: NodeJS.ProcessEnv = process.env): HttpError | null {
  if (!STATE_CHANGING.has(req.method.toUpperCase())) return null;
  const origin = req.headers.get("origin");
  const fetchSite = req.headers.get("sec-fetch-site");
  if (!origin) {
    return fetchSite === "cross-site" ? refusal("another site") : null;
  }
  let host: string | null = null;
  try {
    host = origin === "null" ? null : new URL(origin).host.toLowerCase();
  } catch {
    host = null;
  }
  if (host && allowedHosts(req, env).has(host)) return null;
  return refusal(origin === "null" ? "an opaque origin" : origin);
}

function refusal(from: string): HttpError {
  return new HttpError(
    403,
    `Cross-site request refused: changes must come from Tautline's own pages (this one came from ${from.slice(0, 200)}).`,
    [{ path: "(origin)", message: "the Origin header does not match this site" }],
  );
}
