import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { ROLES, type Role } from "@/lib/auth/roles";
import type { Organisation } from "./Organisation";

export const UNIT_SYSTEMS = ["si", "us"] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/**
 * A person who signs in. `passwordHash` stays null until an invite is accepted.
 * `sessionVersion` is bumped on password change or deactivation so older session tokens stop working.
 */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare organisationId: ForeignKey<Organisation["id"]>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: string | null;
  declare units: CreationOptional<UnitSystem>;
  declare active: CreationOptional<boolean>;
  declare sessionVersion: CreationOptional<number>;
  declare lastSignInAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare organisation?: NonAttribute<Organisation>;
}

export function initUser(sequelize: Sequelize): typeof User {
  User.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      role: { type: DataTypes.STRING(16), allowNull: false, validate: { isIn: [ROLES as unknown as string[]] } },
      passwordHash: { type: DataTypes.STRING(100), allowNull: true },
      units: { type: DataTypes.ENUM(...UNIT_SYSTEMS), allowNull: false, defaultValue: "si" },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      sessionVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      lastSignInAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "users", modelName: "User", underscored: true },
  );
  return User;
}
