import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class ReviewComment extends Model<InferAttributes<ReviewComment>, InferCreationAttributes<ReviewComment>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare procedureVersionId: string;
  declare authorId: string | null;
  declare stepId: string | null;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ReviewComment.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        procedureVersionId: { type: DataTypes.UUID, allowNull: false },
        authorId: { type: DataTypes.UUID, allowNull: true },
        stepId: { type: DataTypes.TEXT, allowNull: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'review_comments', underscored: true },
    );
  }
}
