import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class CoachingNote extends Model<InferAttributes<CoachingNote>, InferCreationAttributes<CoachingNote>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare diagnosisId: string;
  declare stepId: string | null;
  declare authorId: string | null;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    CoachingNote.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        diagnosisId: { type: DataTypes.UUID, allowNull: false },
        stepId: { type: DataTypes.TEXT, allowNull: true },
        authorId: { type: DataTypes.UUID, allowNull: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'coaching_notes', underscored: true },
    );
  }
}
