import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Design-check reports and their review trail. A report is of one scenario revision (and optionally a
 * study); approval stores the stamped PDF and the hash of the content it shows. Reviews are append-only.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("reports", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
      onUpdate: "CASCADE",
    },
    scenario_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "scenarios", key: "id" },
      onDelete: "CASCADE",
      onUpdate: "CASCADE",
    },
    lift_revision_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "lift_revisions", key: "id" },
      onDelete: "RESTRICT",
      onUpdate: "CASCADE",
    },
    run_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "runs", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    study_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "studies", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    title: { type: DataTypes.STRING(200), allowNull: false },
    units: { type: DataTypes.ENUM("si", "us"), allowNull: false, defaultValue: "si" },
    status: { type: DataTypes.ENUM("draft", "submitted", "returned", "approved"), allowNull: false, defaultValue: "draft" },
    author_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    reviewer_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    submitted_at: { type: DataTypes.DATE(3), allowNull: true },
    approved_at: { type: DataTypes.DATE(3), allowNull: true },
    content_hash: { type: DataTypes.CHAR(64), allowNull: true },
    pdf: { type: DataTypes.BLOB("long"), allowNull: true },
    pdf_bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("reports", ["organisation_id", "scenario_id", "id"], { name: "reports_org_scenario" });

  await q.createTable("report_reviews", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    report_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "reports", key: "id" },
      onDelete: "CASCADE",
      onUpdate: "CASCADE",
    },
    organisation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    action: { type: DataTypes.ENUM("submit", "return", "approve"), allowNull: false },
    comment: { type: DataTypes.TEXT, allowNull: true },
    content_hash: { type: DataTypes.CHAR(64), allowNull: true },
    at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("report_reviews", ["report_id", "id"], { name: "report_reviews_report" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("report_reviews");
  await q.dropTable("reports");
}
