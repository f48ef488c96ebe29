import { DataTypes, type QueryInterface } from "sequelize";

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable("trains", {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    organisation_id: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    cars: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    car_mass_empty: { type: DataTypes.DOUBLE, allowNull: false },
    seats_per_car: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    rider_mass: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 75 },
    car_length: { type: DataTypes.DOUBLE, allowNull: false },
    dog_offset: { type: DataTypes.DOUBLE, allowNull: false },
    rolling_resistance: { type: DataTypes.DOUBLE, allowNull: false },
    drag_area: { type: DataTypes.DOUBLE, allowNull: false },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
    archived_at: { type: DataTypes.DATE(3), allowNull: true },
    created_by: {
      type: DataTypes.INTEGER.UNSIGNED,
      allowNull: true,
      references: { model: "users", key: "id" },
      onDelete: "SET NULL",
    },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex("trains", ["organisation_id", "name"], { name: "trains_org_name" });
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.dropTable("trains");
}
