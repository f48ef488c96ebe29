import type { Role } from "./roles";

/**
 * The one permission table. Every route handler, server action and page asks `can(role, action)`;
 * the access tests read this same table to know what each role must get.
 * Organisation scoping is separate and always applies: another organisation's rows answer 404.
 */
export const PERMISSIONS = {
  // Design data: lifts (with revisions), trains, chain catalogue entries, scenarios.
  "design:read": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  "design:write": ["admin", "engineer"],
  // Runs of existing scenarios.
  "run:read": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  "run:start": ["admin", "engineer", "operator", "trainer"],
  "run:cancel": ["admin", "engineer", "operator", "trainer"],
  "run:delete": ["admin", "engineer"],
  // Review comments on scenarios and runs.
  "comment:write": ["admin", "engineer", "reviewer"],
  // Audit trail.
  "audit:read": ["admin", "engineer", "reviewer"],
  // Organisation administration.
  "users:manage": ["admin"],
  // Development mailbox (non-production instances only).
  "devmail:read": ["admin"],
  // Own profile: password, display units.
  "profile:self": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  // Operations logbook, logger recordings, calibration, alerts.
  "logbook:read": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  "logbook:write": ["admin", "engineer", "operator"],
  "logbook:settings": ["admin", "engineer"],
  "recording:upload": ["admin", "engineer", "operator"],
  "calibration:save": ["admin", "engineer"],
  // Trainers' replay sessions: build and share; watch a shared one.
  "training:manage": ["admin", "trainer"],
  "training:watch": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  // Design studies (many runs of one scenario) and design-check reports with sign-off.
  "study:read": ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"],
  "study:run": ["admin", "engineer"],
  "report:read": ["admin", "engineer", "reviewer"],
  "report:write": ["admin", "engineer"],
  "report:review": ["admin", "reviewer"],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

export function can(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role);
}
