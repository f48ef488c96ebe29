import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";
import type { User } from "./User";

export const TOKEN_PURPOSES = ["invite", "reset"] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

/** A one-time link token. Only its SHA-256 hash is stored; the plain token exists only in the e-mail. */
export class AuthToken extends Model<InferAttributes<AuthToken>, InferCreationAttributes<AuthToken>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User["id"]>;
  declare purpose: TokenPurpose;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdByUserId: CreationOptional<number | null>;
  declare createdAt: CreationOptional<Date>;
}

export function initAuthToken(sequelize: Sequelize): typeof AuthToken {
  AuthToken.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      purpose: { type: DataTypes.ENUM(...TOKEN_PURPOSES), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      usedAt: { type: DataTypes.DATE, allowNull: true },
      createdByUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE,
    },
    { sequelize, tableName: "auth_tokens", modelName: "AuthToken", underscored: true, updatedAt: false },
  );
  return AuthToken;
}
