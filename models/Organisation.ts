import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const ORGANISATION_KINDS = ["operator", "engineering"] as const;
export type OrganisationKind = (typeof ORGANISATION_KINDS)[number];

/** A park operator or a ride-engineering firm. Every user and every design row belongs to one. */
export class Organisation extends Model<InferAttributes<Organisation>, InferCreationAttributes<Organisation>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare kind: OrganisationKind;
  declare slug: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initOrganisation(sequelize: Sequelize): typeof Organisation {
  Organisation.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      name: { type: DataTypes.STRING(120), allowNull: false },
      kind: { type: DataTypes.ENUM(...ORGANISATION_KINDS), allowNull: false },
      slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: "organisations", modelName: "Organisation", underscored: true },
  );
  return Organisation;
}
