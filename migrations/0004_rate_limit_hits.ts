import { DataTypes, type QueryInterface } from "sequelize";

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.createTable("rate_limit_hits", {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    bucket: { type: DataTypes.STRING(40), allowNull: false },
    key: { type: DataTypes.STRING(254), allowNull: false },
    hit_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await q.addIndex("rate_limit_hits", ["bucket", "key", "hit_at"], { name: "rate_limit_hits_lookup" });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.dropTable("rate_limit_hits");
}
