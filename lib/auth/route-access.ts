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
  /**
   * Methods that change state without a body (e.g. DELETE, cancel): the test calls them only as callers
   * who must be refused (anonymous, roles without the permission, another organisation), never as an
   * allowed caller of the row's own organisation.
   */
  refusalsOnly?: Method[];
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
  "/api/admin/mail": {
    methods: { GET: needs("devmail:read"), DELETE: needs("devmail:read") },
    nonProduction: true,
    refusalsOnly: ["DELETE"], // an allowed call would empty the mailbox other tests read
  },
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
  // Design data. Writes are probed with {} (fails validation: nothing changes); deletes only as refusals.
  "/api/lifts": { methods: { GET: needs("design:read"), POST: needs("design:write") } },
  "/api/lifts/[id]": {
    methods: { GET: needs("design:read"), PATCH: needs("design:write"), DELETE: needs("design:write") },
    rows: { id: "lifts" },
    refusalsOnly: ["DELETE"],
  },
  "/api/lifts/[id]/revisions": { methods: { GET: needs("design:read") }, rows: { id: "lifts" } },
  "/api/lifts/[id]/revisions/[number]": {
    methods: { GET: needs("design:read") },
    rows: {
      id: "lifts",
      // A revision number (not an id) of the same first lift: revision numbers start at 1.
      number: {
        sql: "SELECT MIN(r.number) AS id FROM lift_revisions r WHERE r.lift_id = (SELECT MIN(l.id) FROM lifts l WHERE l.organisation_id = ?)",
      },
    },
  },
  "/api/chain-specs": { methods: { GET: needs("design:read"), POST: needs("design:write") } },
  "/api/chain-specs/[id]": {
    methods: { GET: needs("design:read"), PATCH: needs("design:write"), DELETE: needs("design:write") },
    rows: { id: "chain_specs" },
    refusalsOnly: ["DELETE"],
  },
  "/api/trains": { methods: { GET: needs("design:read"), POST: needs("design:write") } },
  "/api/trains/[id]": {
    methods: { GET: needs("design:read"), PATCH: needs("design:write"), DELETE: needs("design:write") },
    rows: { id: "trains" },
    refusalsOnly: ["DELETE"],
  },
  "/api/scenarios": { methods: { GET: needs("design:read"), POST: needs("design:write") } },
  "/api/scenarios/import": { methods: { POST: needs("design:write") } },
  "/api/scenarios/[id]": {
    methods: { GET: needs("design:read"), PATCH: needs("design:write"), DELETE: needs("design:write") },
    rows: { id: "scenarios" },
    refusalsOnly: ["DELETE"],
  },
  "/api/scenarios/[id]/export": { methods: { GET: needs("design:read") }, rows: { id: "scenarios" } },
  // The probe's empty name fails validation, so the access test makes no copy.
  "/api/scenarios/[id]/copy": { methods: { POST: needs("design:write") }, rows: { id: "scenarios" }, probeBody: { name: "" } },
  "/api/scenarios/[id]/comments": {
    methods: { GET: needs("design:read"), POST: needs("comment:write") },
    rows: { id: "scenarios" },
  },
  "/api/scenarios/[id]/comments/[commentId]": {
    methods: { PATCH: needs("comment:write"), DELETE: needs("comment:write") },
    rows: {
      id: "scenarios",
      // The demo reviewer's comment on the park's first scenario (seeded by lib/comments/seed.ts).
      commentId: {
        sql: "SELECT MIN(c.id) AS id FROM comments c WHERE c.scenario_id = (SELECT MIN(s.id) FROM scenarios s WHERE s.organisation_id = ?)",
      },
    },
    refusalsOnly: ["DELETE"],
  },
  "/api/audit": { methods: { GET: needs("audit:read") } },
  // Operations logbook, uploads, recordings and calibration. Probe bodies fail validation: nothing is stored.
  "/api/logbook/entries": { methods: { GET: needs("logbook:read"), POST: needs("logbook:write") } },
  "/api/logbook/alerts": { methods: { GET: needs("logbook:read") } },
  "/api/logbook/lifts/[id]": { methods: { GET: needs("logbook:read") }, rows: { id: "lifts" } },
  "/api/logbook/lifts/[id]/settings": { methods: { PUT: needs("logbook:settings") }, rows: { id: "lifts" } },
  // A copy of a scenario of the lift with the newest measured elongation, and its run (logbook:write and run:start).
  "/api/logbook/lifts/[id]/chain-run": { methods: { POST: needs("logbook:write") }, rows: { id: "lifts" } },
  "/api/uploads": { methods: { POST: needs("logbook:write") } },
  "/api/uploads/[id]": { methods: { GET: needs("logbook:read") }, rows: { id: "uploads" } },
  "/api/recordings": { methods: { GET: needs("logbook:read"), POST: needs("recording:upload") } },
  "/api/recordings/[id]": { methods: { GET: needs("logbook:read") }, rows: { id: "recordings" } },
  "/api/recordings/[id]/overlay": { methods: { GET: needs("logbook:read") }, rows: { id: "recordings" } },
  "/api/recordings/[id]/calibrate": { methods: { POST: needs("run:start") }, rows: { id: "recordings" } },
  "/api/recordings/[id]/calibration": { methods: { GET: needs("logbook:read"), POST: needs("calibration:save") }, rows: { id: "recordings" } },
  // Follows one named calibration (?calibrationId=): without it the probe gets 400 at once.
  "/api/recordings/[id]/calibration/events": { methods: { GET: needs("logbook:read") }, rows: { id: "recordings" } },
  // Trainers' replay sessions. The demo park's seeded session is shared, so viewers may open it.
  "/api/training/sessions": { methods: { GET: needs("training:watch"), POST: needs("training:manage") } },
  "/api/training/sessions/[id]": {
    methods: { GET: needs("training:watch"), PATCH: needs("training:manage"), DELETE: needs("training:manage") },
    rows: { id: { sql: "SELECT MIN(id) AS id FROM training_sessions WHERE organisation_id = ? AND shared_at IS NOT NULL" } },
    refusalsOnly: ["DELETE"],
  },
  "/api/training/sessions/[id]/share": {
    methods: { POST: needs("training:manage") },
    rows: { id: { sql: "SELECT MIN(id) AS id FROM training_sessions WHERE organisation_id = ? AND shared_at IS NOT NULL" } },
    probeBody: { invite: "not a list" }, // a valid body would e-mail the park's viewers
  },
  "/api/training/sessions/[id]/views": {
    methods: { GET: needs("training:manage"), POST: needs("training:watch") },
    rows: { id: { sql: "SELECT MIN(id) AS id FROM training_sessions WHERE organisation_id = ? AND shared_at IS NOT NULL" } },
  },
  // Studies and design-check reports (the demo park has one finished study and one draft report, lib/studies/seed.ts).
  // Probe bodies fail validation, so the access test starts no study and changes no report.
  "/api/studies": { methods: { GET: needs("study:read"), POST: needs("study:run") } },
  // Without ?ids= the probe gets 400 at once; a study list names the running studies it follows.
  "/api/studies/events": { methods: { GET: needs("study:read") } },
  "/api/studies/[id]": { methods: { GET: needs("study:read") }, rows: { id: "studies" } },
  "/api/studies/[id]/events": { methods: { GET: needs("study:read") }, rows: { id: "studies" } },
  "/api/studies/[id]/export": { methods: { GET: needs("study:read") }, rows: { id: "studies" } },
  "/api/studies/[id]/cancel": { methods: { POST: needs("study:run") }, rows: { id: "studies" }, refusalsOnly: ["POST"] },
  "/api/studies/[id]/resume": { methods: { POST: needs("study:run") }, rows: { id: "studies" }, refusalsOnly: ["POST"] },
  "/api/reports": { methods: { GET: needs("report:read"), POST: needs("report:write") } },
  "/api/reports/[id]": { methods: { GET: needs("report:read") }, rows: { id: "reports" } },
  "/api/reports/[id]/pdf": { methods: { GET: needs("report:read") }, rows: { id: "reports" } },
  "/api/reports/[id]/submit": { methods: { POST: needs("report:write") }, rows: { id: "reports" }, refusalsOnly: ["POST"] },
  "/api/reports/[id]/approve": { methods: { POST: needs("report:review") }, rows: { id: "reports" }, probeBody: { comment: 5 } },
  "/api/reports/[id]/return": { methods: { POST: needs("report:review") }, rows: { id: "reports" }, probeBody: {} },
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
  "/studies": { access: needs("study:read") },
  "/studies/[id]": { access: needs("study:read"), rows: { id: "studies" } },
  "/logbook": { access: signedIn },
  "/replays": { access: needs("run:read") },
  "/settings": { access: needs("profile:self") },
  "/admin": { access: needs("users:manage") },
  "/admin/users": { access: needs("users:manage") },
  "/admin/mail": { access: needs("devmail:read"), nonProduction: true },
  // Workspace screens: design forms, scenario run view, saved runs.
  "/lifts/new": { access: needs("design:write") },
  "/lifts/[id]": { access: needs("design:read"), rows: { id: "lifts" } },
  "/trains/new": { access: needs("design:write") },
  "/trains/[id]": { access: needs("design:read"), rows: { id: "trains" } },
  "/scenarios/new": { access: needs("design:write") },
  "/scenarios/[id]": { access: needs("design:read"), rows: { id: "scenarios" } },
  "/runs/[id]": { access: needs("run:read"), rows: { id: "runs" } },
  // Operations: logger upload, a recording with overlay and calibration; replay sessions.
  "/logbook/upload": { access: needs("recording:upload") },
  "/logbook/recordings/[id]": { access: needs("logbook:read"), rows: { id: "recordings" } },
  "/replays/[id]": {
    access: needs("training:watch"),
    rows: { id: { sql: "SELECT MIN(id) AS id FROM training_sessions WHERE organisation_id = ? AND shared_at IS NOT NULL" } },
  },
  // Sign-off: the reviewer queue, one report (the e-mail links here), and the audit trail.
  "/reports": { access: needs("report:read") },
  "/reports/[id]": { access: needs("report:read"), rows: { id: "reports" } },
  "/audit": { access: needs("audit:read") },
  "/replays/[id]/edit": {
    access: needs("training:manage"),
    rows: { id: { sql: "SELECT MIN(id) AS id FROM training_sessions WHERE organisation_id = ? AND shared_at IS NOT NULL" } },
  },
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
