import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * One answered step of a diagnosis. The id is generated on the phone so that a step sent twice
 * (offline outbox retries) is stored once; payload_hash tells a true repeat from a conflicting one.
 */
export class DiagnosisStep extends Model<InferAttributes<DiagnosisStep>, InferCreationAttributes<DiagnosisStep>> {
  declare id: string;
  declare shopId: string;
  declare diagnosisId: string;
  declare seq: number;
  declare stepId: string;
  declare kind: string;
  declare shown: CreationOptional<Record<string, unknown>>;
  declare entered: string | null;
  declare value: number | null;
  declare unit: string | null;
  declare verdict: string | null;
  declare bandId: string | null;
  declare answerId: string | null;
  declare superseded: CreationOptional<boolean>;
  declare note: CreationOptional<string>;
  declare startedAt: Date;
  declare answeredAt: Date;
  declare payloadHash: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    DiagnosisStep.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        shopId: { type: DataTypes.UUID, allowNull: false },
        diagnosisId: { type: DataTypes.UUID, allowNull: false },
        seq: { type: DataTypes.INTEGER, allowNull: false },
        stepId: { type: DataTypes.TEXT, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        shown: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        entered: { type: DataTypes.TEXT, allowNull: true },
        value: { type: DataTypes.DOUBLE, allowNull: true },
        unit: { type: DataTypes.TEXT, allowNull: true },
        verdict: { type: DataTypes.TEXT, allowNull: true },
        bandId: { type: DataTypes.TEXT, allowNull: true },
        answerId: { type: DataTypes.TEXT, allowNull: true },
        superseded: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        startedAt: { type: DataTypes.DATE, allowNull: false },
        answeredAt: { type: DataTypes.DATE, allowNull: false },
        payloadHash: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'diagnosis_steps', underscored: true, updatedAt: false },
    );
  }
}
