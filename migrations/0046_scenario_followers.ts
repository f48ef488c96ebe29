import { DataTypes, type QueryInterface } from "sequelize";

/**
 * Several trains on the lift: `followers` lists the trains after the scenario's lead train, each
 * `{ trainId, loading, riderCount, entrySpeed (m/s), startPosition (m), startTime (s) }` (format 2
 * `trains[1..n]`); NULL = the lead train alone.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("scenarios", "followers", { type: DataTypes.JSON, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn("scenarios", "followers");
}
