import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from "sequelize";

/** A review comment on a scenario, optionally about one of its runs. */
export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare scenarioId: number;
  /** A run of the scenario the comment is about (no foreign key: runs may be deleted). */
  declare runId: number | null;
  declare userId: number | null;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initComment(sequelize: Sequelize): typeof Comment {
  Comment.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      organisationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      scenarioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      body: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: "comments", modelName: "Comment", underscored: true },
  );
  return Comment;
}
