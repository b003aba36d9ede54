import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
  declare id: CreationOptional<number>;
  declare shopId: string | null;
  declare userId: string | null;
  declare action: string;
  declare entity: string;
  declare entityId: string | null;
  declare detail: CreationOptional<Record<string, unknown>>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    AuditLog.init(
      {
        id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
        shopId: { type: DataTypes.UUID, allowNull: true },
        userId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        entity: { type: DataTypes.TEXT, allowNull: false },
        entityId: { type: DataTypes.TEXT, allowNull: true },
        detail: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_log', underscored: true, updatedAt: false },
    );
  }
}
