import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export const REPORT_STATUSES = ["draft", "submitted", "returned", "approved"] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

/** A design-check report of one scenario revision (optionally with a study's window); see lib/reports. */
export class Report extends Model<InferAttributes<Report>, InferCreationAttributes<Report>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare scenarioId: number;
  declare liftRevisionId: number;
  declare runId: number | null;
  declare studyId: number | null;
  declare title: string;
  declare units: CreationOptional<"si" | "us">;
  declare status: CreationOptional<ReportStatus>;
  declare authorId: number | null;
  declare reviewerId: number | null;
  declare submittedAt: Date | null;
  declare approvedAt: Date | null;
  /** sha256 of the report's content (lib/reports/content.ts), stamped on approval. */
  declare contentHash: string | null;
  /** The approved, stamped PDF (drafts are drawn on request). */
  declare pdf: Buffer | null;
  declare pdfBytes: number | null;
  /** Set at approval: every input and the content the approved PDF shows (lib/reports/snapshot.ts). */
  declare snapshot: CreationOptional<Record<string, unknown> | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initReport(sequelize: Sequelize): typeof Report {
  Report.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      scenarioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftRevisionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      studyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      title: { type: DataTypes.STRING(200), allowNull: false },
      units: { type: DataTypes.ENUM("si", "us"), allowNull: false, defaultValue: "si" },
      status: { type: DataTypes.ENUM(...REPORT_STATUSES), allowNull: false, defaultValue: "draft" },
      authorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      reviewerId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      submittedAt: { type: DataTypes.DATE(3), allowNull: true },
      approvedAt: { type: DataTypes.DATE(3), allowNull: true },
      contentHash: { type: DataTypes.CHAR(64), allowNull: true },
      pdf: { type: DataTypes.BLOB("long"), allowNull: true },
      pdfBytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      snapshot: { type: DataTypes.JSON, allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    {
      sequelize,
      tableName: "reports",
      modelName: "Report",
      underscored: true,
      defaultScope: { attributes: { exclude: ["pdf", "snapshot"] } },
      scopes: { withPdf: {}, withSnapshot: { attributes: { exclude: ["pdf"] } } },
    },
  );
  return Report;
}
