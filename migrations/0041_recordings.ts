import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Logger recordings of a dispatch, attached to a lift revision: the mapped columns (SI) one row per sample.
 * The file as received stays in object storage (uploads row).
 */
const ref = (model: string, allowNull: boolean, onDelete: "CASCADE" | "SET NULL" | "RESTRICT") => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model, key: "id" },
  onDelete,
  onUpdate: "CASCADE",
});

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("recordings", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: ref("organisations", false, "CASCADE"),
    lift_id: ref("lifts", false, "CASCADE"),
    lift_revision_id: ref("lift_revisions", false, "RESTRICT"),
    upload_id: ref("uploads", true, "SET NULL"),
    name: { type: DataTypes.STRING(200), allowNull: false },
    mapping: { type: DataTypes.JSON, allowNull: false },
    channels: { type: DataTypes.JSON, allowNull: false },
    sample_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    duration: { type: DataTypes.DOUBLE, allowNull: false },
    engagement_time: { type: DataTypes.DOUBLE, allowNull: true },
    created_by: ref("users", true, "SET NULL"),
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("recordings", ["organisation_id", "lift_id", "id"], { name: "recordings_lift" });
  await q.createTable("recording_samples", {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    recording_id: ref("recordings", false, "CASCADE"),
    idx: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    t: { type: DataTypes.DOUBLE, allowNull: false },
    take_up_position: { type: DataTypes.DOUBLE, allowNull: true },
    chain_tension: { type: DataTypes.DOUBLE, allowNull: true },
    drive_current: { type: DataTypes.DOUBLE, allowNull: true },
    train_position: { type: DataTypes.DOUBLE, allowNull: true },
    train_speed: { type: DataTypes.DOUBLE, allowNull: true },
  });
  await q.addIndex("recording_samples", ["recording_id", "idx"], { unique: true, name: "recording_samples_order" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("recording_samples");
  await q.dropTable("recordings");
}
