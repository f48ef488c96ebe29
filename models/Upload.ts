import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A file as received (inspection photo or logger CSV): the object lives in storage under `storageKey`. */
export class Upload extends Model<InferAttributes<Upload>, InferCreationAttributes<Upload>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare liftId: number | null;
  declare kind: "photo" | "recording";
  declare storageKey: string;
  declare originalName: string;
  /** The type found from the content (magic bytes), never the one the browser sent. */
  declare contentType: string;
  declare bytes: number;
  declare sha256: string;
  declare entryId: number | null;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initUpload(sequelize: Sequelize): typeof Upload {
  Upload.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      liftId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      kind: { type: DataTypes.ENUM("photo", "recording"), allowNull: false },
      storageKey: { type: DataTypes.STRING(200), allowNull: false },
      originalName: { type: DataTypes.STRING(200), allowNull: false },
      contentType: { type: DataTypes.STRING(80), allowNull: false },
      bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      sha256: { type: DataTypes.CHAR(64), allowNull: false },
      entryId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "uploads", modelName: "Upload", underscored: true },
  );
  return Upload;
}
