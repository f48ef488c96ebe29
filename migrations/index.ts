import type { QueryInterface } from "sequelize";
import * as m0001 from "./0001_organisations";
import * as m0002 from "./0002_users";
import * as m0003 from "./0003_auth_tokens";
import * as m0004 from "./0004_rate_limit_hits";

export interface Migration {
  name: string;
  up: (params: { context: QueryInterface }) => Promise<void>;
  down: (params: { context: QueryInterface }) => Promise<void>;
}

// Statically imported so a production build can load them (no glob of .ts files at run time).
// To add one: create migrations/NNNN_name.ts exporting `up` and `down`, import it here, append it below.
export const migrations: Migration[] = [
  { name: "0001_organisations", ...m0001 },
  { name: "0002_users", ...m0002 },
  { name: "0003_auth_tokens", ...m0003 },
  { name: "0004_rate_limit_hits", ...m0004 },
];
