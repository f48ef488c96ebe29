import type { Sequelize } from "sequelize";
import { getSequelize } from "@/lib/db/sequelize";
import { initOrganisation, Organisation } from "./Organisation";
import { initUser, User } from "./User";
import { initAuthToken, AuthToken } from "./AuthToken";
import { initRateLimitHit, RateLimitHit } from "./RateLimitHit";

export { Organisation, User, AuthToken, RateLimitHit };

/**
 * Every model, bound to one Sequelize instance. To add a model: import its class and init function,
 * add it to this object type, init it in `initModels`, and set its associations in `associate`.
 */
export interface Models {
  Organisation: typeof Organisation;
  User: typeof User;
  AuthToken: typeof AuthToken;
  RateLimitHit: typeof RateLimitHit;
}

const boundTo = new WeakMap<Sequelize, Models>();

function associate(m: Models): void {
  m.Organisation.hasMany(m.User, { foreignKey: "organisationId", as: "users" });
  m.User.belongsTo(m.Organisation, { foreignKey: "organisationId", as: "organisation" });
  m.User.hasMany(m.AuthToken, { foreignKey: "userId", as: "tokens" });
  m.AuthToken.belongsTo(m.User, { foreignKey: "userId", as: "user" });
}

/** Inits all models on `sequelize` and sets their associations. Calling it again is a no-op. */
export function initModels(sequelize: Sequelize): Models {
  const existing = boundTo.get(sequelize);
  if (existing) return existing;
  const m: Models = {
    Organisation: initOrganisation(sequelize),
    User: initUser(sequelize),
    AuthToken: initAuthToken(sequelize),
    RateLimitHit: initRateLimitHit(sequelize),
  };
  associate(m);
  boundTo.set(sequelize, m);
  return m;
}

/** The models bound to the process-wide connection from lib/db/sequelize.ts. */
export function getModels(): Models {
  return initModels(getSequelize());
}

/** Short alias: `db().User.findOne(...)`. */
export const db = getModels;
