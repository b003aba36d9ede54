import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A shop meter and its accuracy spec, ±(% of reading + counts) at a resolution per quantity. */
export interface MeterSpecEntry {
  quantity: string;
  percentOfReading: number;
  counts: number;
  resolution: number;
}

export class Meter extends Model<InferAttributes<Meter>, InferCreationAttributes<Meter>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare name: string;
  declare spec: { entries: MeterSpecEntry[] };
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Meter.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        spec: { type: DataTypes.JSONB, allowNull: false, defaultValue: { entries: [] } },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'meters', underscored: true },
    );
  }
}
