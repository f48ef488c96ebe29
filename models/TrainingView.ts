import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** How far one person has watched one item of a session (one row per item and person). */
export class TrainingView extends Model<InferAttributes<TrainingView>, InferCreationAttributes<TrainingView>> {
  declare id: CreationOptional<number>;
  declare sessionId: number;
  declare itemId: number;
  declare userId: number;
  declare watchedTo: number;
  declare completed: boolean;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTrainingView(sequelize: Sequelize): typeof TrainingView {
  TrainingView.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      sessionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      itemId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      watchedTo: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      completed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "training_views", modelName: "TrainingView", underscored: true },
  );
  return TrainingView;
}
