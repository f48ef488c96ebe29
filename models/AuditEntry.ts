import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export const AUDIT_ACTIONS = ["create", "update", "delete", "archive", "import"] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** Who changed what and when. Written by lib/audit/record.ts inside the same transaction as the change. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  /** Null when the system acted (seeding, a background job). */
  declare userId: number | null;
  /** e.g. "lift", "chain_spec", "train", "scenario", "run", "comment" */
  declare entity: string;
  declare entityId: string;
  declare action: AuditAction;
  declare before: unknown;
  declare after: unknown;
  declare at: CreationOptional<Date>;
}

export function initAuditEntry(sequelize: Sequelize): typeof AuditEntry {
  AuditEntry.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      entity: { type: DataTypes.STRING(40), allowNull: false },
      entityId: { type: DataTypes.STRING(64), allowNull: false },
      action: { type: DataTypes.STRING(20), allowNull: false },
      before: { type: DataTypes.JSON, allowNull: true },
      after: { type: DataTypes.JSON, allowNull: true },
      at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    },
    { sequelize, tableName: "audit_entries", modelName: "AuditEntry", underscored: true, timestamps: false },
  );
  return AuditEntry;
}
