import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

export type ReviewAction = "submit" | "return" | "approve";

/** One step of a report's sign-off (append-only): submitted, returned with comments, or approved. */
export class ReportReview extends Model<InferAttributes<ReportReview>, InferCreationAttributes<ReportReview>> {
  declare id: CreationOptional<number>;
  declare reportId: number;
  declare organisationId: number;
  declare userId: number | null;
  declare action: ReviewAction;
  declare comment: string | null;
  declare contentHash: string | null;
  declare at: Date;
}

export function initReportReview(sequelize: Sequelize): typeof ReportReview {
  ReportReview.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      reportId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      action: { type: DataTypes.ENUM("submit", "return", "approve"), allowNull: false },
      comment: { type: DataTypes.TEXT, allowNull: true },
      contentHash: { type: DataTypes.CHAR(64), allowNull: true },
      at: { type: DataTypes.DATE(3), allowNull: false },
    },
    { sequelize, tableName: "report_reviews", modelName: "ReportReview", underscored: true, timestamps: false },
  );
  return ReportReview;
}
