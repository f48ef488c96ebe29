import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Operations logbook: per-lift settings (replacement limit, warning levels, forecast horizon), entries
 * (elongation, take-up at rest, links removed, lubrication, inspection), files received (inspection
 * photos and logger CSVs, kept in object storage; only their key and checked type live here) and alerts.
 */
const id = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true };
const ref = (model: string, allowNull: boolean, onDelete: "CASCADE" | "SET NULL" | "RESTRICT") => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model, key: "id" },
  onDelete,
  onUpdate: "CASCADE",
});
const stamps = {
  created_at: { type: DataTypes.DATE(3), allowNull: false },
  updated_at: { type: DataTypes.DATE(3), allowNull: false },
};

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("logbook_settings", {
    id,
    organisation_id: ref("organisations", false, "CASCADE"),
    lift_id: ref("lifts", false, "CASCADE"),
    elongation_limit: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 3 },
    elongation_warning: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 2.5 },
    take_up_warning: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0.8 },
    horizon_days: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 90 },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    ...stamps,
  });
  await q.addIndex("logbook_settings", ["lift_id"], { unique: true, name: "logbook_settings_lift" });

  await q.createTable("uploads", {
    id,
    organisation_id: ref("organisations", false, "CASCADE"),
    lift_id: ref("lifts", true, "CASCADE"),
    kind: { type: DataTypes.ENUM("photo", "recording"), allowNull: false },
    storage_key: { type: DataTypes.STRING(200), allowNull: false },
    original_name: { type: DataTypes.STRING(200), allowNull: false },
    content_type: { type: DataTypes.STRING(80), allowNull: false },
    bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    sha256: { type: DataTypes.CHAR(64), allowNull: false },
    entry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_by: ref("users", true, "SET NULL"),
    ...stamps,
  });
  await q.addIndex("uploads", ["storage_key"], { unique: true, name: "uploads_key" });
  await q.addIndex("uploads", ["organisation_id", "entry_id"], { name: "uploads_entry" });

  await q.createTable("logbook_entries", {
    id,
    organisation_id: ref("organisations", false, "CASCADE"),
    lift_id: ref("lifts", false, "CASCADE"),
    lift_revision_id: ref("lift_revisions", false, "RESTRICT"),
    kind: { type: DataTypes.ENUM("elongation", "take-up", "links-removed", "lubrication", "inspection"), allowNull: false },
    measured_at: { type: DataTypes.DATE(3), allowNull: false },
    user_id: ref("users", true, "SET NULL"),
    data: { type: DataTypes.JSON, allowNull: false },
    elongation_percent: { type: DataTypes.DOUBLE, allowNull: true },
    take_up_position: { type: DataTypes.DOUBLE, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    ...stamps,
  });
  await q.addIndex("logbook_entries", ["organisation_id", "lift_id", "measured_at"], { name: "logbook_entries_lift" });

  await q.createTable("alerts", {
    id,
    organisation_id: ref("organisations", false, "CASCADE"),
    lift_id: ref("lifts", false, "CASCADE"),
    kind: { type: DataTypes.STRING(40), allowNull: false },
    level: { type: DataTypes.ENUM("warning", "limit", "forecast"), allowNull: false },
    message: { type: DataTypes.TEXT, allowNull: false },
    entry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    // "open" while the alert stands; NULL once cleared, so a later crossing can open (and mail) a new one.
    open_key: { type: DataTypes.STRING(80), allowNull: true },
    recipients: { type: DataTypes.JSON, allowNull: true },
    emailed_at: { type: DataTypes.DATE(3), allowNull: true },
    mail_error: { type: DataTypes.TEXT, allowNull: true },
    cleared_at: { type: DataTypes.DATE(3), allowNull: true },
    ...stamps,
  });
  await q.addIndex("alerts", ["open_key"], { unique: true, name: "alerts_open_key" });
  await q.addIndex("alerts", ["organisation_id", "lift_id", "created_at"], { name: "alerts_lift" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("alerts");
  await q.dropTable("logbook_entries");
  await q.dropTable("uploads");
  await q.dropTable("logbook_settings");
}
