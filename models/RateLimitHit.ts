import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/**
 * One counted event for a rate limit (e.g. a failed sign-in), keyed by bucket ("signin:account") and key
 * (the e-mail or IP). Kept in the database so limits hold across restarts and several app processes.
 */
export class RateLimitHit extends Model<InferAttributes<RateLimitHit>, InferCreationAttributes<RateLimitHit>> {
  declare id: CreationOptional<number>;
  declare bucket: string;
  declare key: string;
  declare hitAt: Date;
}

export function initRateLimitHit(sequelize: Sequelize): typeof RateLimitHit {
  RateLimitHit.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      bucket: { type: DataTypes.STRING(40), allowNull: false },
      key: { type: DataTypes.STRING(254), allowNull: false },
      hitAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { sequelize, tableName: "rate_limit_hits", modelName: "RateLimitHit", underscored: true, timestamps: false },
  );
  return RateLimitHit;
}
