import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** One saved run in a session, at `position` (0, 1, 2 …). */
export class TrainingItem extends Model<InferAttributes<TrainingItem>, InferCreationAttributes<TrainingItem>> {
  declare id: CreationOptional<number>;
  declare sessionId: number;
  declare runId: number;
  declare position: number;
  declare title: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTrainingItem(sequelize: Sequelize): typeof TrainingItem {
  TrainingItem.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      sessionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      title: { type: DataTypes.STRING(200), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "training_items", modelName: "TrainingItem", underscored: true },
  );
  return TrainingItem;
}
