import type { Action } from "./permissions";

/**
 * Who may call each route handler and open each page. The access test (tests/e2e/access.spec.ts) finds
 * every app/**\/route.ts and page.tsx, fails when one has no entry here, and calls each one anonymously,
 * as every role and as a user of another organisation, expecting what this table and the permission
 * table say. Route handlers still check on the server themselves (requireUser / requirePermission).
 *
 * Keys are URL patterns as the files spell them, route groups removed: app/api/admin/users/[id]/route.ts
 * is "/api/admin/users/[id]"; app/(workspace)/lifts/page.tsx is "/lifts".
 */
export type Access = "public" | "signed-in" | { action: Action };

export const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type Method = (typeof METHODS)[number];

export interface ApiRouteAccess {
  methods: Partial<Record<Method, Access>>;
  /**
   * For dynamic segments: where the test finds a row of the demo park to put in each segment. A table
   * name means `SELECT id FROM <table> WHERE organisation_id = ? ORDER BY id LIMIT 1`; for rows scoped
   * through a parent give `{ sql }` with one `?` for the organisation id. Users of another organisation
   * must get 404 for that row.
   */
  rows?: Record<string, RowSource>;
  /** Body sent by the test for writes (default `{}`): it must not pass validation, so nothing changes. */
  probeBody?: unknown;
  /** Not for the access test to call (explain why in a comment), e.g. the next-auth catch-all. */
  skipProbe?: boolean;
  /** Answers 404 on production instances (development tools). */
  nonProduction?: boolean;
}

export type RowSource = string | { sql: string };

export interface PageAccess {
  access: Access;
  rows?: Record<string, RowSource>;
  nonProduction?: boolean;
  /** Pages that need a query parameter to be useful (they still answer 200 without it). */
  query?: string;
}

const everyone: Access = "public";
const signedIn: Access = "signed-in";
const needs = (action: Action): Access => ({ action });

export const API_ROUTES: Record<string, ApiRouteAccess> = {
  // next-auth's own endpoints (csrf, session, providers, callback, signout); the sign-in test covers them.
  "/api/auth/[...nextauth]": { methods: { GET: everyone, POST: everyone }, skipProbe: true },
  "/api/account/forgot-password": { methods: { POST: everyone } },
  "/api/account/reset-password": { methods: { POST: everyone } },
  "/api/account/accept-invite": { methods: { POST: everyone } },
  "/api/me": { methods: { GET: needs("profile:self"), PATCH: needs("profile:self") } },
  "/api/me/password": { methods: { POST: needs("profile:self") } },
  "/api/admin/users": { methods: { GET: needs("users:manage"), POST: needs("users:manage") } },
  "/api/admin/users/[id]": { methods: { PATCH: needs("users:manage") }, rows: { id: "users" } },
  "/api/admin/users/[id]/invite": { methods: { POST: needs("users:manage") }, rows: { id: "users" } },
  "/api/admin/mail": { methods: { GET: needs("devmail:read"), DELETE: needs("devmail:read") }, nonProduction: true },
  // Runs. The probe bodies fail validation so the access test starts nothing; DELETE without ?version= is a 400.
  "/api/scenarios/[id]/runs": {
    methods: { GET: needs("run:read"), POST: needs("run:start") },
    rows: { id: "scenarios" },
    probeBody: { segments: 0 },
  },
  "/api/runs/[id]": { methods: { GET: needs("run:read"), DELETE: needs("run:delete") }, rows: { id: "runs" } },
  "/api/runs/[id]/result": { methods: { GET: needs("run:read") }, rows: { id: "runs" } },
  "/api/runs/[id]/events": { methods: { GET: needs("run:read") }, rows: { id: "runs" } },
  "/api/runs/[id]/cancel": { methods: { POST: needs("run:cancel") }, rows: { id: "runs" } },
};

export const PAGE_ROUTES: Record<string, PageAccess> = {
  "/": { access: everyone },
  "/sign-in": { access: everyone },
  "/forgot-password": { access: everyone },
  "/reset-password": { access: everyone, query: "token" },
  "/accept-invite": { access: everyone, query: "token" },
  "/dashboard": { access: signedIn },
  "/lifts": { access: needs("design:read") },
  "/trains": { access: needs("design:read") },
  "/scenarios": { access: needs("design:read") },
  "/studies": { access: needs("run:read") },
  "/logbook": { access: signedIn },
  "/replays": { access: needs("run:read") },
  "/settings": { access: needs("profile:self") },
  "/admin": { access: needs("users:manage") },
  "/admin/users": { access: needs("users:manage") },
  "/admin/mail": { access: needs("devmail:read"), nonProduction: true },
};

/** Turns a file under app/ into its URL pattern: drops route groups and the file name. */
export function patternFromFile(relativeToApp: string): string {
  const parts = relativeToApp.split(/[\\/]/).slice(0, -1).filter((p) => !(p.startsWith("(") && p.endsWith(")")));
  return "/" + parts.join("/");
}

/** Page patterns the proxy must keep for signed-in users (everything not public). */
export function protectedPagePatterns(): string[] {
  return Object.entries(PAGE_ROUTES)
    .filter(([, p]) => p.access !== "public")
    .map(([k]) => k);
}
