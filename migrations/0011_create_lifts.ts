import { DataTypes, type QueryInterface } from "sequelize";

// Lifts and their immutable revisions. lifts.current_revision_id points into lift_revisions, which points
// back at lifts, so the constraint on current_revision_id is added after both tables exist.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable("lifts", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    site: { type: DataTypes.STRING(120), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    current_revision_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    archived_at: { type: DataTypes.DATE(3), allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("lifts", ["organisation_id", "name"], { name: "lifts_org_name" });

  await qi.createTable("lift_revisions", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    lift_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "lifts", key: "id" },
      onDelete: "CASCADE",
    },
    number: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    site: { type: DataTypes.STRING(120), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    geometry: { type: DataTypes.JSON, allowNull: false },
    chain: { type: DataTypes.JSON, allowNull: false },
    chain_spec_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "chain_specs", key: "id" },
      onDelete: "SET NULL",
    },
    drive: { type: DataTypes.JSON, allowNull: false },
    take_up: { type: DataTypes.JSON, allowNull: false },
    anti_rollback: { type: DataTypes.JSON, allowNull: false },
    limits: { type: DataTypes.JSON, allowNull: true },
    change_summary: { type: DataTypes.STRING(500), allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("lift_revisions", ["lift_id", "number"], { name: "lift_revisions_lift_number", unique: true });

  await qi.addConstraint("lifts", {
    type: "foreign key",
    name: "lifts_current_revision_fk",
    fields: ["current_revision_id"],
    references: { table: "lift_revisions", field: "id" },
    onDelete: "SET NULL",
    onUpdate: "CASCADE",
  });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.removeConstraint("lifts", "lifts_current_revision_fk");
  await qi.dropTable("lift_revisions");
  await qi.dropTable("lifts");
}
