import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/**
 * A train of identical rigid cars. Loaded car mass = carMassEmpty + riders × riderMass; the scenario's
 * loading case picks the rider count. SI units.
 */
export class Train extends Model<InferAttributes<Train>, InferCreationAttributes<Train>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare name: string;
  declare notes: string | null;
  declare cars: number;
  /** kg per car, without riders */
  declare carMassEmpty: number;
  declare seatsPerCar: number;
  /** kg per rider (default 75 kg: an assumption the user can change) */
  declare riderMass: number;
  /** m */
  declare carLength: number;
  /** m behind the train's front */
  declare dogOffset: number;
  /** coefficient on the normal force */
  declare rollingResistance: number;
  /** m² (drag coefficient × frontal area) */
  declare dragArea: number;
  /** m behind the front, the ARD pawls (format 2 `trains[].pawls`); null = one pawl at the dog. */
  declare pawls: number[] | null;
  declare version: CreationOptional<number>;
  declare archivedAt: Date | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTrain(sequelize: Sequelize): typeof Train {
  Train.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      cars: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      carMassEmpty: { type: DataTypes.DOUBLE, allowNull: false },
      seatsPerCar: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      riderMass: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 75 },
      carLength: { type: DataTypes.DOUBLE, allowNull: false },
      dogOffset: { type: DataTypes.DOUBLE, allowNull: false },
      rollingResistance: { type: DataTypes.DOUBLE, allowNull: false },
      dragArea: { type: DataTypes.DOUBLE, allowNull: false },
      pawls: { type: DataTypes.JSON, allowNull: true },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
      archivedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "trains", modelName: "Train", underscored: true },
  );
  return Train;
}
