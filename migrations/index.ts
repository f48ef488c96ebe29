import type { QueryInterface } from "sequelize";
import * as m0001 from "./0001_organisations";
import * as m0002 from "./0002_users";
import * as m0003 from "./0003_auth_tokens";
import * as m0004 from "./0004_rate_limit_hits";
import * as m0010 from "./0010_create_chain_specs";
import * as m0011 from "./0011_create_lifts";
import * as m0012 from "./0012_create_trains";
import * as m0013 from "./0013_create_scenarios";
import * as m0014 from "./0014_create_audit_entries";
import * as m0015 from "./0015_create_comments";
import * as m0016 from "./0016_widen_scenario_names";
import * as m0017 from "./0017_scenario_format_2";
import * as m0018 from "./0018_train_pawls";
import * as m0020 from "./0020_runs";
import * as m0021 from "./0021_run_overrides";
import * as m0030 from "./0030_studies";
import * as m0031 from "./0031_reports";
import * as m0032 from "./0032_report_snapshots";
import * as m0040 from "./0040_logbook";
import * as m0041 from "./0041_recordings";
import * as m0042 from "./0042_training";
import * as m0043 from "./0043_calibrations";
import * as m0044 from "./0044_logbook_idempotency";
import * as m0045 from "./0045_seed_steps";
import * as m0046 from "./0046_scenario_followers";

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
  { name: "0010_create_chain_specs", ...m0010 },
  { name: "0011_create_lifts", ...m0011 },
  { name: "0012_create_trains", ...m0012 },
  { name: "0013_create_scenarios", ...m0013 },
  { name: "0014_create_audit_entries", ...m0014 },
  { name: "0015_create_comments", ...m0015 },
  { name: "0016_widen_scenario_names", ...m0016 },
  { name: "0017_scenario_format_2", ...m0017 },
  { name: "0018_train_pawls", ...m0018 },
  { name: "0020_runs", ...m0020 },
  { name: "0021_run_overrides", ...m0021 },
  { name: "0030_studies", ...m0030 },
  { name: "0031_reports", ...m0031 },
  { name: "0032_report_snapshots", ...m0032 },
  { name: "0040_logbook", ...m0040 },
  { name: "0041_recordings", ...m0041 },
  { name: "0042_training", ...m0042 },
  { name: "0043_calibrations", ...m0043 },
  { name: "0044_logbook_idempotency", ...m0044 },
  { name: "0045_seed_steps", ...m0045 },
  { name: "0046_scenario_followers", ...m0046 },
];
