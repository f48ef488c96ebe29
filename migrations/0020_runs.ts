import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Runs of the engine. A run pins the lift revision it used and keeps the full resolved engine scenario
 * (`inputs`), so editing the lift, the train or the scenario later never changes what this run shows.
 * Like the design tables, runs go with their organisation and their scenario (the API archives scenarios
 * that have runs rather than deleting them); a pinned lift revision cannot be deleted underneath a run.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("runs", {
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
    status: {
      type: DataTypes.ENUM("queued", "running", "done", "failed", "cancelled"),
      allowNull: false,
      defaultValue: "queued",
    },
    progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    started_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    inputs: { type: DataTypes.JSON, allowNull: false },
    solver: { type: DataTypes.JSON, allowNull: false },
    summary: { type: DataTypes.JSON, allowNull: true },
    diagnostics: { type: DataTypes.JSON, allowNull: true },
    result: { type: DataTypes.BLOB("long"), allowNull: true },
    result_format: { type: DataTypes.STRING(32), allowNull: true },
    result_bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    wall_time_ms: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    error_code: { type: DataTypes.STRING(40), allowNull: true },
    runner: { type: DataTypes.STRING(120), allowNull: true },
    queued_at: { type: DataTypes.DATE(3), allowNull: false },
    started_at: { type: DataTypes.DATE(3), allowNull: true },
    finished_at: { type: DataTypes.DATE(3), allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex("runs", ["organisation_id", "scenario_id", "id"], { name: "runs_org_scenario" });
  await q.addIndex("runs", ["status"], { name: "runs_status" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("runs");
}
