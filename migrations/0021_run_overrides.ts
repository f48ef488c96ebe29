import { DataTypes, type QueryInterface } from "sequelize";

/**
 * What-if runs: `overrides` keeps the slider values a run was started with (SI, null for a plain run) and
 * `overrides_from` the scenario's own values they replaced, so the run still says what it varied after the
 * scenario is edited.
 */
export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn("runs", "overrides", { type: DataTypes.JSON, allowNull: true });
  await q.addColumn("runs", "overrides_from", { type: DataTypes.JSON, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn("runs", "overrides_from");
  await q.removeColumn("runs", "overrides");
}
