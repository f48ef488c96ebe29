import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const ENTRY_KINDS = ["elongation", "take-up", "links-removed", "lubrication", "inspection"] as const;
export type EntryKind = (typeof ENTRY_KINDS)[number];

/** One logbook entry of a lift; `data` holds the kind's own fields (SI), the two trend values have columns. */
export class LogbookEntry extends Model<InferAttributes<LogbookEntry>, InferCreationAttributes<LogbookEntry>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare liftId: number;
  declare liftRevisionId: number;
  declare kind: EntryKind;
  declare measuredAt: Date;
  declare userId: number | null;
  declare data: Record<string, unknown>;
  declare elongationPercent: number | null;
  declare takeUpPosition: number | null;
  declare notes: string | null;
  /** The client's Idempotency-Key for the write that made this row (lib/http/idempotency.ts). */
  declare idempotencyKey: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initLogbookEntry(sequelize: Sequelize): typeof LogbookEntry {
  LogbookEntry.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      kind: { type: DataTypes.ENUM(...ENTRY_KINDS), allowNull: false },
      measuredAt: { type: DataTypes.DATE(3), allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      data: { type: DataTypes.JSON, allowNull: false },
      elongationPercent: { type: DataTypes.DOUBLE, allowNull: true },
      takeUpPosition: { type: DataTypes.DOUBLE, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: true },
      idempotencyKey: { type: DataTypes.STRING(100), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "logbook_entries", modelName: "LogbookEntry", underscored: true },
  );
  return LogbookEntry;
}
