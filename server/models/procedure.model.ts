import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Procedure extends Model<InferAttributes<Procedure>, InferCreationAttributes<Procedure>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare slug: string;
  declare title: string;
  declare symptom: string;
  declare ignitionSystem: CreationOptional<string>;
  declare archivedAt: Date | null;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Procedure.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        slug: { type: DataTypes.TEXT, allowNull: false },
        title: { type: DataTypes.TEXT, allowNull: false },
        symptom: { type: DataTypes.TEXT, allowNull: false },
        ignitionSystem: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedures', underscored: true },
    );
  }
}
