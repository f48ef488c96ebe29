import { DataTypes, type QueryInterface } from "sequelize";

// A scenario pins one lift revision; RESTRICT keeps a pinned revision (and its lift, and the train) from
// being deleted underneath it — the API archives those instead.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable("scenarios", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    lift_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "lifts", key: "id" },
      onDelete: "RESTRICT",
    },
    lift_revision_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "lift_revisions", key: "id" },
      onDelete: "RESTRICT",
    },
    train_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "trains", key: "id" },
      onDelete: "RESTRICT",
    },
    loading: { type: DataTypes.ENUM("empty", "full", "riders"), allowNull: false },
    rider_count: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    entry_speed: { type: DataTypes.DOUBLE, allowNull: false },
    start_position: { type: DataTypes.DOUBLE, allowNull: false },
    run_settings: { type: DataTypes.JSON, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    archived_at: { type: DataTypes.DATE(3), allowNull: true },
    frozen_at: { type: DataTypes.DATE(3), allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("scenarios", ["organisation_id", "name"], { name: "scenarios_org_name" });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable("scenarios");
}
