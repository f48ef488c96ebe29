import { DataTypes, type QueryInterface } from "sequelize";

/**
 * What an approval signed: every input of the report (scenario, lift revision, chain, train, limits,
 * engine formats) and the content the PDF was drawn from, kept on the report so later edits of the
 * live rows never change an approved record.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("reports", "snapshot", { type: DataTypes.JSON, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn("reports", "snapshot");
}
