import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Photo metadata; the bytes live in object storage under object_key. */
export class Attachment extends Model<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: string;
  declare shopId: string;
  declare diagnosisId: string;
  declare stepId: string | null;
  declare objectKey: string;
  declare thumbKey: string | null;
  declare contentType: string;
  declare byteSize: number;
  declare originalName: CreationOptional<string>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Attachment.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        shopId: { type: DataTypes.UUID, allowNull: false },
        diagnosisId: { type: DataTypes.UUID, allowNull: false },
        stepId: { type: DataTypes.TEXT, allowNull: true },
        objectKey: { type: DataTypes.TEXT, allowNull: false },
        thumbKey: { type: DataTypes.TEXT, allowNull: true },
        contentType: { type: DataTypes.TEXT, allowNull: false },
        byteSize: { type: DataTypes.INTEGER, allowNull: false },
        originalName: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'attachments', underscored: true, updatedAt: false },
    );
  }
}
