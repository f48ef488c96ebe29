import type { Role } from "./roles";
import type { OrganisationKind } from "@/models/Organisation";

/**
 * The demo organisations and accounts the seed creates. README, the seed and the tests all read this list.
 * Everything here is invented: no real park, ride, company or person.
 */
export const DEMO_PASSWORD = "tautline-demo";

export interface DemoOrganisation {
  slug: string;
  name: string;
  kind: OrganisationKind;
}

export interface DemoAccount {
  email: string;
  name: string;
  role: Role;
  organisation: string; // slug
}

export const DEMO_ORGANISATIONS = {
  park: { slug: "lanternfell", name: "Lanternfell Park", kind: "operator" },
  firm: { slug: "cardlevane", name: "Cardlevane Ride Engineering", kind: "engineering" },
} as const satisfies Record<string, DemoOrganisation>;

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: "admin@lanternfell.example", name: "Mira Okafor-Lund", role: "admin", organisation: "lanternfell" },
  { email: "engineer@lanternfell.example", name: "Tomas Reyl", role: "engineer", organisation: "lanternfell" },
  { email: "reviewer@lanternfell.example", name: "Ines Varga-Holt", role: "reviewer", organisation: "lanternfell" },
  { email: "operator@lanternfell.example", name: "Dell Amsel", role: "operator", organisation: "lanternfell" },
  { email: "trainer@lanternfell.example", name: "Priya Castellane", role: "trainer", organisation: "lanternfell" },
  { email: "viewer@lanternfell.example", name: "Joss Wrenfield", role: "viewer", organisation: "lanternfell" },
  { email: "admin@cardlevane.example", name: "Ruo Fennick", role: "admin", organisation: "cardlevane" },
  { email: "engineer@cardlevane.example", name: "Hale Bramcote", role: "engineer", organisation: "cardlevane" },
  { email: "viewer@cardlevane.example", name: "Sunniva Orrel", role: "viewer", organisation: "cardlevane" },
];

/** The park's account for a role (one per role). */
export function demoAccount(role: Role, organisation: string = DEMO_ORGANISATIONS.park.slug): DemoAccount {
  const a = DEMO_ACCOUNTS.find((x) => x.role === role && x.organisation === organisation);
  if (!a) throw new Error(`No demo account for ${role} in ${organisation}`);
  return a;
}
