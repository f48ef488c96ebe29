import type { Action } from "@/lib/auth/permissions";

export interface NavItem {
  href: string;
  label: string;
  /** What the area is for, shown on the dashboard. */
  purpose: string;
  /** Shown only to roles that may do this; otherwise every signed-in user sees it. */
  action?: Action;
  group: "design" | "operate" | "admin";
}

export const NAV_ITEMS: NavItem[] = [
  { href: "/dashboard", label: "Overview", purpose: "Recent runs with their failed checks, open alerts, and the way to each area.", group: "design" },
  {
    href: "/lifts",
    label: "Lifts",
    purpose: "Lift hills: profile, drive sprocket, idler, chain, take-up and counterweight, with revisions.",
    action: "design:read",
    group: "design",
  },
  {
    href: "/trains",
    label: "Trains",
    purpose: "Trains and their cars: masses, chain dogs and where they pick up the chain.",
    action: "design:read",
    group: "design",
  },
  {
    href: "/scenarios",
    label: "Scenarios",
    purpose: "Load cases to run: dispatch, pick-up, stops on the lift, rollback onto the ARD.",
    action: "design:read",
    group: "design",
  },
  {
    href: "/reports",
    label: "Reviews",
    purpose: "Design-check reports: the queue awaiting review, returns with comments, approvals.",
    action: "report:read",
    group: "design",
  },
  {
    href: "/studies",
    label: "Studies",
    purpose: "Sweeps over a scenario's inputs, with snatch loads and safety factors side by side.",
    action: "run:read",
    group: "operate",
  },
  {
    href: "/logbook",
    label: "Logbook",
    purpose: "Measured chain elongation and take-up position over time, next to what the model expects.",
    group: "operate",
  },
  {
    href: "/replays",
    label: "Replays",
    purpose: "Step through a run on the lift hill, with notes for training.",
    action: "run:read",
    group: "operate",
  },
  {
    href: "/audit",
    label: "Audit trail",
    purpose: "Who changed what and when, by lift, person and date, with each change shown field by field.",
    action: "audit:read",
    group: "admin",
  },
  { href: "/admin/users", label: "Admin", purpose: "People, roles and invitations.", action: "users:manage", group: "admin" },
];
