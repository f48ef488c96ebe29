import { DataTypes, type QueryInterface } from "sequelize";

// entity_id is text so any table's key fits (runs may use another id type).
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable("audit_entries", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entity_id: { type: DataTypes.STRING(64), allowNull: false },
    action: { type: DataTypes.STRING(20), allowNull: false },
    before: { type: DataTypes.JSON, allowNull: true },
    after: { type: DataTypes.JSON, allowNull: true },
    at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("audit_entries", ["organisation_id", "entity", "entity_id"], { name: "audit_entries_entity" });
  await qi.addIndex("audit_entries", ["organisation_id", "at"], { name: "audit_entries_at" });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable("audit_entries");
}
