import type { Role } from "./roles";
import type { UnitSystem } from "@/models/User";

/** What every server entry point knows about the signed-in person (fresh from the database). */
export interface CurrentUser {
  id: number;
  organisationId: number;
  role: Role;
  email: string;
  name: string;
  units: UnitSystem;
}
