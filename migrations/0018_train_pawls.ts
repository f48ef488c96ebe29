import { DataTypes, type QueryInterface } from "sequelize";

/** A train's ARD pawl positions, m behind its front (format 2 `trains[].pawls`); NULL = one pawl at the dog. */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("trains", "pawls", { type: DataTypes.JSON, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn("trains", "pawls");
}
