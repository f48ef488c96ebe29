/**
 * Security headers. Pages get a Content-Security-Policy with a fresh nonce per request from proxy.ts
 * (Next puts the nonce on its own inline and framework scripts); everything else (API answers, files)
 * gets the static headers below from next.config.ts.
 */

export interface Header {
  key: string;
  value: string;
}

/** Sent on every answer. */
export const STATIC_SECURITY_HEADERS: Header[] = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
];

/** API answers are data, never documents: nothing in them may run or be framed. */
// (next.config.ts headers replace a route's own CSP, so this one includes the downloads' sandbox.)
export const API_CSP = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'; sandbox";

/**
 * The page policy: scripts only with this request's nonce (plus what they load, 'strict-dynamic'), no
 * inline-script holes. Styles allow inline `style` attributes (React and the canvas set them); that is
 * not a script hole. Development adds 'unsafe-eval' for React's dev tooling.
 */
export function pageCsp(nonce: string, dev = process.env.NODE_ENV !== "production"): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** 128 random bits, base64: unguessable per request (Web Crypto, so it also runs in the proxy). */
export function newNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  let s = "";
  for (const b of bytes) s += String.fromCharCode(b);
  return btoa(s);
}
