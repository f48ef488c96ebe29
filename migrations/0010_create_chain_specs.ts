import { DataTypes, type QueryInterface } from "sequelize";

// The chain catalogue: organisation_id NULL = shared standard rows, else the organisation's own chains.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable("chain_specs", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    designation: { type: DataTypes.STRING(120), allowNull: false },
    pitch: { type: DataTypes.DOUBLE, allowNull: false },
    mass_per_length: { type: DataTypes.DOUBLE, allowNull: false },
    axial_stiffness: { type: DataTypes.DOUBLE, allowNull: false },
    breaking_strength: { type: DataTypes.DOUBLE, allowNull: false },
    source: { type: DataTypes.STRING(500), allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
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
  await qi.addIndex("chain_specs", ["organisation_id", "designation"], { name: "chain_specs_org_designation" });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable("chain_specs");
}
