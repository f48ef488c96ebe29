import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A logbook alert of a lift. `openKey` ("lift:kind") is unique while the alert stands, so it is mailed once. */
export class Alert extends Model<InferAttributes<Alert>, InferCreationAttributes<Alert>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare liftId: number;
  declare kind: string;
  declare level: "warning" | "limit" | "forecast";
  declare message: string;
  declare entryId: number | null;
  declare openKey: string | null;
  declare recipients: CreationOptional<string[] | null>;
  declare emailedAt: CreationOptional<Date | null>;
  declare mailError: CreationOptional<string | null>;
  declare clearedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initAlert(sequelize: Sequelize): typeof Alert {
  Alert.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.STRING(40), allowNull: false },
      level: { type: DataTypes.ENUM("warning", "limit", "forecast"), allowNull: false },
      message: { type: DataTypes.TEXT, allowNull: false },
      entryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      openKey: { type: DataTypes.STRING(80), allowNull: true },
      recipients: { type: DataTypes.JSON, allowNull: true },
      emailedAt: { type: DataTypes.DATE(3), allowNull: true },
      mailError: { type: DataTypes.TEXT, allowNull: true },
      clearedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "alerts", modelName: "Alert", underscored: true },
  );
  return Alert;
}
