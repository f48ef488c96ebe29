import { DataTypes, type QueryInterface } from "sequelize";

/** Trainers' replay sessions: ordered saved runs with captions pinned to moments, and who watched what. */
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
  await q.createTable("training_sessions", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: ref("organisations", false, "CASCADE"),
    title: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: true },
    created_by: ref("users", true, "SET NULL"),
    shared_at: { type: DataTypes.DATE(3), allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    ...stamps,
  });
  await q.createTable("training_items", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    session_id: ref("training_sessions", false, "CASCADE"),
    run_id: ref("runs", false, "RESTRICT"),
    position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: true },
    ...stamps,
  });
  await q.addIndex("training_items", ["session_id", "position"], { name: "training_items_order" });
  await q.createTable("training_captions", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    item_id: ref("training_items", false, "CASCADE"),
    at: { type: DataTypes.DOUBLE, allowNull: false },
    text: { type: DataTypes.STRING(500), allowNull: false },
    ...stamps,
  });
  await q.addIndex("training_captions", ["item_id", "at"], { name: "training_captions_item" });
  await q.createTable("training_views", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    session_id: ref("training_sessions", false, "CASCADE"),
    item_id: ref("training_items", false, "CASCADE"),
    user_id: ref("users", false, "CASCADE"),
    watched_to: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    completed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ...stamps,
  });
  await q.addIndex("training_views", ["item_id", "user_id"], { unique: true, name: "training_views_once" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("training_views");
  await q.dropTable("training_captions");
  await q.dropTable("training_items");
  await q.dropTable("training_sessions");
}
