import { DataTypes, type QueryInterface } from "sequelize";

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("organisations", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    kind: { type: DataTypes.ENUM("operator", "engineering"), allowNull: false },
    slug: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("organisations");
}
