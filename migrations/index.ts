import type { QueryInterface } from "sequelize";

export interface Migration {
  name: string;
  up: (params: { context: QueryInterface }) => Promise<void>;
  down: (params: { context: QueryInterface }) => Promise<void>;
}

// Statically imported so a production build can load them (no glob of .ts files at run time).
// To add one: create migrations/NNNN_name.ts exporting `up` and `down`, import it here, append it below.
export const migrations: Migration[] = [];
