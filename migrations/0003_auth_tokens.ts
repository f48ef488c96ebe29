import { DataTypes, type QueryInterface } from "sequelize";

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("auth_tokens", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
      onUpdate: "CASCADE",
    },
    purpose: { type: DataTypes.ENUM("invite", "reset"), allowNull: false },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_by_user_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
      onUpdate: "CASCADE",
    },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex("auth_tokens", ["user_id", "purpose"], { name: "auth_tokens_user_purpose" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("auth_tokens");
}
