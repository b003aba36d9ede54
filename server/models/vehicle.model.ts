import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Vehicle extends Model<InferAttributes<Vehicle>, InferCreationAttributes<Vehicle>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare label: string;
  declare model: CreationOptional<string>;
  declare frameNumber: CreationOptional<string>;
  declare hours: number | null;
  declare notes: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Vehicle.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        label: { type: DataTypes.TEXT, allowNull: false },
        model: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        frameNumber: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        // numeric comes back from pg as a string; keep the API a number
        hours: {
          type: DataTypes.DECIMAL(10, 1),
          allowNull: true,
          get(this: Vehicle) {
            const raw = this.getDataValue('hours') as unknown;
            return raw === null || raw === undefined ? null : Number(raw);
          },
        },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'vehicles', underscored: true },
    );
  }
}
