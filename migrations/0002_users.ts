import { DataTypes, type QueryInterface } from "sequelize";

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("users", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "RESTRICT",
      onUpdate: "CASCADE",
    },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: true },
    units: { type: DataTypes.ENUM("si", "us"), allowNull: false, defaultValue: "si" },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    session_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex("users", ["organisation_id"], { name: "users_organisation_id" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("users");
}
