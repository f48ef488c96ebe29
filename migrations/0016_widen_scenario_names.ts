import { DataTypes, type QueryInterface } from "sequelize";

// The scenario file format allows names of up to 200 characters; an imported scenario keeps its name whole.
export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.changeColumn("scenarios", "name", { type: DataTypes.STRING(200), allowNull: false });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.sequelize.query("UPDATE scenarios SET name = LEFT(name, 120) WHERE CHAR_LENGTH(name) > 120");
  await qi.changeColumn("scenarios", "name", { type: DataTypes.STRING(120), allowNull: false });
}
