import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/**
 * A chain lift. Its engineering data lives in revisions (models/LiftRevision): every save writes a new
 * revision and bumps `version`, so runs that point at an old revision keep the inputs they used.
 */
export class Lift extends Model<InferAttributes<Lift>, InferCreationAttributes<Lift>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare name: string;
  declare site: string | null;
  declare notes: string | null;
  declare currentRevisionId: number | null;
  /** Optimistic concurrency: an update must carry the version it edits. */
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initLift(sequelize: Sequelize): typeof Lift {
  Lift.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      site: { type: DataTypes.STRING(120), allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      currentRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      archivedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "lifts", modelName: "Lift", underscored: true },
  );
  return Lift;
}
