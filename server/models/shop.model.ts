import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export interface ShopSettings {
  /** a vehicle back within this many days counts as a comeback */
  comebackDays?: number;
  /** an untouched active diagnosis is marked abandoned after this many hours */
  abandonAfterHours?: number;
  /** where diagnosis reports are e-mailed */
  serviceDeskEmail?: string;
}

export class Shop extends Model<InferAttributes<Shop>, InferCreationAttributes<Shop>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare slug: string;
  declare settings: CreationOptional<ShopSettings>;
  /** BCP 47 tag for dates and numbers ("de-DE"); null: each device follows its browser. */
  declare locale: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Shop.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: false },
        slug: { type: DataTypes.TEXT, allowNull: false, unique: true },
        settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        locale: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'shops', underscored: true },
    );
  }
}
