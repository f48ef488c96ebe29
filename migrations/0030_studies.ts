import { DataTypes, type QueryInterface } from "sequelize";

const STATUS = ["queued", "running", "done", "failed", "cancelled"] as const;

/**
 * Design studies: one scenario varied over one or two parameters. Each case is a run (run_id) plus the
 * headline figures and checks copied from it, so the study's table, plots and window never decode blobs.
 * Cases are created with the study (status queued) so a restart finds the unfinished ones and resumes.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("studies", {
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
    name: { type: DataTypes.STRING(200), allowNull: false },
    parameters: { type: DataTypes.JSON, allowNull: false },
    settings: { type: DataTypes.JSON, allowNull: false },
    status: { type: DataTypes.ENUM(...STATUS), allowNull: false, defaultValue: "queued" },
    mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: "pool" },
    cases_total: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    cases_done: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    cases_failed: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    driver: { type: DataTypes.STRING(120), allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    started_at: { type: DataTypes.DATE(3), allowNull: true },
    finished_at: { type: DataTypes.DATE(3), allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("studies", ["organisation_id", "scenario_id", "id"], { name: "studies_org_scenario" });
  await q.addIndex("studies", ["status"], { name: "studies_status" });

  await q.createTable("study_cases", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    study_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "studies", key: "id" },
      onDelete: "CASCADE",
      onUpdate: "CASCADE",
    },
    organisation_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    idx: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    values: { type: DataTypes.JSON, allowNull: false },
    status: { type: DataTypes.ENUM(...STATUS), allowNull: false, defaultValue: "queued" },
    run_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "runs", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    headline: { type: DataTypes.JSON, allowNull: true },
    checks: { type: DataTypes.JSON, allowNull: true },
    acceptable: { type: DataTypes.BOOLEAN, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    wall_time_ms: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    finished_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("study_cases", ["study_id", "idx"], { name: "study_cases_study_idx", unique: true });
  await q.addIndex("study_cases", ["run_id"], { name: "study_cases_run" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("study_cases");
  await q.dropTable("studies");
}
