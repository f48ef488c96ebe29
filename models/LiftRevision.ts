import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/**
 * One immutable revision of a lift: the engine's sections as JSON (validated with the sim section schemas
 * before they are written) plus a snapshot of name/site/notes. The chain section holds the chain's values
 * COPIED from the catalogue entry it came from (`chainSpecId`), so editing the catalogue later never
 * changes an old revision. Sections are stored in SI units, with the engine's field names.
 */
export class LiftRevision extends Model<InferAttributes<LiftRevision>, InferCreationAttributes<LiftRevision>> {
  declare id: CreationOptional<number>;
  declare liftId: number;
  /** 1, 2, 3 … per lift. */
  declare number: number;
  declare name: string;
  declare site: string | null;
  declare notes: string | null;
  /** Engine section `lift` (track geometry and chain extent). */
  declare geometry: Record<string, unknown>;
  /** Engine section `chain` (copied chain values + routing). */
  declare chain: Record<string, unknown>;
  declare chainSpecId: number | null;
  declare drive: Record<string, unknown>;
  declare takeUp: Record<string, unknown>;
  declare antiRollback: Record<string, unknown>;
  declare limits: Record<string, unknown> | null;
  declare changeSummary: string | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
}

export function initLiftRevision(sequelize: Sequelize): typeof LiftRevision {
  LiftRevision.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      site: { type: DataTypes.STRING(120), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      geometry: { type: DataTypes.JSON, allowNull: false },
      chain: { type: DataTypes.JSON, allowNull: false },
      chainSpecId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      drive: { type: DataTypes.JSON, allowNull: false },
      takeUp: { type: DataTypes.JSON, allowNull: false },
      antiRollback: { type: DataTypes.JSON, allowNull: false },
      limits: { type: DataTypes.JSON, allowNull: true },
      changeSummary: { type: DataTypes.STRING(500), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
    },
    {
      sequelize,
      tableName: "lift_revisions",
      modelName: "LiftRevision",
      underscored: true,
      updatedAt: false,
    },
  );
  return LiftRevision;
}
