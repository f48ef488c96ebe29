import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Calibration jobs: the fit of a recording's take-up trace runs in the job pool, so its state lives here
 * (queued → running → done / failed, like runs). `inputs` keeps the engine scenario and the trace the fit
 * was given, so a queue worker elsewhere can run it and the fit can be repeated; `result` is the fit.
 */
const ref = (model: string, allowNull: boolean, onDelete: "CASCADE" | "SET NULL") => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model, key: "id" },
  onDelete,
  onUpdate: "CASCADE",
});

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("calibrations", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: ref("organisations", false, "CASCADE"),
    recording_id: ref("recordings", false, "CASCADE"),
    scenario_id: ref("scenarios", false, "CASCADE"),
    started_by: ref("users", true, "SET NULL"),
    status: { type: DataTypes.ENUM("queued", "running", "done", "failed"), allowNull: false, defaultValue: "queued" },
    progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    options: { type: DataTypes.JSON, allowNull: false },
    inputs: { type: DataTypes.JSON, allowNull: false },
    result: { type: DataTypes.JSON, allowNull: true },
    error: { type: DataTypes.TEXT, allowNull: true },
    error_code: { type: DataTypes.STRING(40), allowNull: true },
    runner: { type: DataTypes.STRING(120), allowNull: true },
    wall_time_ms: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    queued_at: { type: DataTypes.DATE(3), allowNull: false },
    started_at: { type: DataTypes.DATE(3), allowNull: true },
    finished_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("calibrations", ["organisation_id", "recording_id", "id"], { name: "calibrations_recording" });
  await q.addIndex("calibrations", ["status"], { name: "calibrations_status" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("calibrations");
}
