import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/**
 * One roller chain in the catalogue. `organisationId` null = the shared standard catalogue (read-only for
 * everyone); otherwise the organisation's own chain (e.g. from its manufacturer's data sheet). SI units.
 */
export class ChainSpec extends Model<InferAttributes<ChainSpec>, InferCreationAttributes<ChainSpec>> {
  declare id: CreationOptional<number>;
  declare organisationId: number | null;
  declare designation: string;
  /** m */
  declare pitch: number;
  /** kg/m */
  declare massPerLength: number;
  /** N per unit strain (E·A) */
  declare axialStiffness: number;
  /** N, minimum ultimate tensile strength */
  declare breakingStrength: number;
  /** The standard or document each value comes from. */
  declare source: string;
  /** Which values are recalled, approximate or assumed. */
  declare note: string | null;
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initChainSpec(sequelize: Sequelize): typeof ChainSpec {
  ChainSpec.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      designation: { type: DataTypes.STRING(120), allowNull: false },
      pitch: { type: DataTypes.DOUBLE, allowNull: false },
      massPerLength: { type: DataTypes.DOUBLE, allowNull: false },
      axialStiffness: { type: DataTypes.DOUBLE, allowNull: false },
      breakingStrength: { type: DataTypes.DOUBLE, allowNull: false },
      source: { type: DataTypes.STRING(500), allowNull: false },
      note: { type: DataTypes.TEXT, allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      archivedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "chain_specs", modelName: "ChainSpec", underscored: true },
  );
  return ChainSpec;
}
