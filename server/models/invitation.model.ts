import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '@shared/schema/roles';

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare email: string;
  declare name: CreationOptional<string>;
  declare roles: Role[];
  declare tokenHash: string;
  declare invitedBy: string | null;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        email: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        roles: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false, unique: true },
        invitedBy: { type: DataTypes.UUID, allowNull: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations', underscored: true },
    );
  }
}
