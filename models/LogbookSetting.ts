import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** Per-lift logbook levels: elongation limit and warning (%), take-up warning (fraction of usable travel), forecast horizon. */
export class LogbookSetting extends Model<InferAttributes<LogbookSetting>, InferCreationAttributes<LogbookSetting>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare liftId: number;
  declare elongationLimit: number;
  declare elongationWarning: number;
  declare takeUpWarning: number;
  declare horizonDays: number;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initLogbookSetting(sequelize: Sequelize): typeof LogbookSetting {
  LogbookSetting.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      elongationLimit: { type: DataTypes.DOUBLE, allowNull: false },
      elongationWarning: { type: DataTypes.DOUBLE, allowNull: false },
      takeUpWarning: { type: DataTypes.DOUBLE, allowNull: false },
      horizonDays: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "logbook_settings", modelName: "LogbookSetting", underscored: true },
  );
  return LogbookSetting;
}
