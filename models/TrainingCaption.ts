import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A caption pinned to a moment `at` (s of the run's replay). */
export class TrainingCaption extends Model<InferAttributes<TrainingCaption>, InferCreationAttributes<TrainingCaption>> {
  declare id: CreationOptional<number>;
  declare itemId: number;
  declare at: number;
  declare text: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTrainingCaption(sequelize: Sequelize): typeof TrainingCaption {
  TrainingCaption.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      itemId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      at: { type: DataTypes.DOUBLE, allowNull: false },
      text: { type: DataTypes.STRING(500), allowNull: false },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "training_captions", modelName: "TrainingCaption", underscored: true },
  );
  return TrainingCaption;
}
