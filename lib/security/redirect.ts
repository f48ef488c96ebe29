/**
 * Where to send someone after signing in: only a path on this site. Browsers treat `\` like `/` and
 * ignore tabs and line breaks in URLs, so `/\evil.example`, `//evil.example`, `/%5Cevil.example` and
 * `/\t/evil.example` all leave the site; every such form (also percent-encoded, once or twice) is refused.
 * Plain TypeScript: the sign-in page (server) and the sign-in form (browser) use the same check.
 */
export const DEFAULT_AFTER_SIGN_IN = "/dashboard";

const BASE = "http://tautline.invalid";

export function isSameOriginPath(url: unknown): url is string {
  if (typeof url !== "string" || url.length === 0 || url.length > 2000) return false;
  let text = url;
  // Look at the text as written and as decoded (twice: some servers decode again on the way).
  for (let round = 0; round < 3; round++) {
    if (!text.startsWith("/") || text.startsWith("//") || /[\\\u0000-\u001f\u007f]/.test(text)) return false;
    let decoded: string;
    try {
      decoded = decodeURIComponent(text);
    } catch {
      return false;
    }
    if (decoded === text) break;
    text = decoded;
  }
  try {
    const resolved = new URL(url, BASE);
    return resolved.origin === BASE && resolved.pathname.startsWith("/") && !resolved.pathname.startsWith("//");
  } catch {
    return false;
  }
}

/** The callback when it is a same-origin path, else the dashboard. */
export function safeCallbackPath(url: unknown): string {
  return isSameOriginPath(url) ? url : DEFAULT_AFTER_SIGN_IN;
}
