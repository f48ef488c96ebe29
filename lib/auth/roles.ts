export const ROLES = ["admin", "engineer", "reviewer", "operator", "trainer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  engineer: "Ride engineer",
  reviewer: "Reviewer",
  operator: "Operations & maintenance",
  trainer: "Trainer",
  viewer: "Viewer",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
