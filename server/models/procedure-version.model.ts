import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type VersionStatus = 'draft' | 'in_review' | 'published' | 'retired';

/**
 * A draft or a numbered version of a procedure. `document` is the procedure graph (the shared
 * schema, with its schemaVersion); published and retired rows are never edited.
 */
export class ProcedureVersion extends Model<InferAttributes<ProcedureVersion>, InferCreationAttributes<ProcedureVersion>> {
  declare id: CreationOptional<string>;
  declare shopId: string;
  declare procedureId: string;
  declare number: number | null;
  declare status: VersionStatus;
  declare document: Record<string, unknown>;
  declare lockVersion: CreationOptional<number>;
  declare lintReport: CreationOptional<unknown[]>;
  /** Which version of each procedure its "Continue in" steps continue in (slug → version id), fixed at publish. */
  declare links: CreationOptional<Record<string, string>>;
  declare basedOnId: string | null;
  declare createdBy: string | null;
  declare updatedBy: string | null;
  declare publishedBy: string | null;
  declare publishedAt: Date | null;
  declare retiredAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    ProcedureVersion.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        shopId: { type: DataTypes.UUID, allowNull: false },
        procedureId: { type: DataTypes.UUID, allowNull: false },
        number: { type: DataTypes.INTEGER, allowNull: true },
        status: { type: DataTypes.TEXT, allowNull: false },
        document: { type: DataTypes.JSONB, allowNull: false },
        lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        lintReport: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        links: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        basedOnId: { type: DataTypes.UUID, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        updatedBy: { type: DataTypes.UUID, allowNull: true },
        publishedBy: { type: DataTypes.UUID, allowNull: true },
        publishedAt: { type: DataTypes.DATE, allowNull: true },
        retiredAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedure_versions', underscored: true },
    );
  }
}
