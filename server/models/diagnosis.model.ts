import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type DiagnosisStatus = 'active' | 'finished' | 'handed_off' | 'abandoned';

/** One walk through one published procedure version for one vehicle. */
export class Diagnosis extends Model<InferAttributes<Diagnosis>, InferCreationAttributes<Diagnosis>> {
  declare id: string;
  declare shopId: string;
  declare procedureVersionId: string;
  declare vehicleId: string;
  declare technicianId: string;
  declare meterId: string | null;
  declare status: CreationOptional<DiagnosisStatus>;
  declare complaint: CreationOptional<string>;
  declare conditions: CreationOptional<Record<string, unknown>>;
  declare endingStepId: string | null;
  declare outcome: Record<string, unknown> | null;
  declare startedAt: CreationOptional<Date>;
  declare endedAt: Date | null;
  declare lastActivityAt: CreationOptional<Date>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Diagnosis.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        shopId: { type: DataTypes.UUID, allowNull: false },
        procedureVersionId: { type: DataTypes.UUID, allowNull: false },
        vehicleId: { type: DataTypes.UUID, allowNull: false },
        technicianId: { type: DataTypes.UUID, allowNull: false },
        meterId: { type: DataTypes.UUID, allowNull: true },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'active' },
        complaint: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        conditions: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        endingStepId: { type: DataTypes.TEXT, allowNull: true },
        outcome: { type: DataTypes.JSONB, allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        endedAt: { type: DataTypes.DATE, allowNull: true },
        lastActivityAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'diagnoses', underscored: true },
    );
  }
}
