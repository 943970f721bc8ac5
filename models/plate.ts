import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { PlateState } from '@/lib/domain/plate-states';

/** One imported plate and where it stands in sign-off; version guards concurrent transitions. */
export class Plate extends Model<InferAttributes<Plate>, InferCreationAttributes<Plate>> {
  declare id: CreationOptional<string>;
  declare screenId: string;
  declare uploadedFileId: string;
  declare importTemplateId: string | null;
  declare supersedesPlateId: string | null;
  declare label: string;
  declare format: PlateFormat;
  declare state: CreationOptional<PlateState>;
  declare version: CreationOptional<number>;
  /** Per target: Z′ with its band and pass/fail, run-down and normalisation notes (from lib/science/plate-analysis). */
  declare qcSummary: CreationOptional<unknown[]>;
  /** Facts the file gives outside its table: barcode, run date, cell line, temperature, operator (lib/imports/plate-facts.ts). */
  declare facts: CreationOptional<Record<string, string>>;
  /** True from an import or a change to wells or models until a job has refitted the plate (lib/jobs). */
  declare fitsPending: CreationOptional<boolean>;
  declare fitsRequestedAt: CreationOptional<Date | null>;
  declare fittedAt: CreationOptional<Date | null>;
  declare importedBy: string;
  declare verifiedBy: string | null;
  declare submittedBy: string | null;
  declare decidedBy: string | null;
  declare importedAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Plate.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        screenId: { type: DataTypes.UUID, allowNull: false },
        uploadedFileId: { type: DataTypes.UUID, allowNull: false },
        importTemplateId: { type: DataTypes.UUID, allowNull: true },
        supersedesPlateId: { type: DataTypes.UUID, allowNull: true },
        label: { type: DataTypes.TEXT, allowNull: false },
        format: { type: DataTypes.SMALLINT, allowNull: false },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'imported' },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        qcSummary: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        facts: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        fitsPending: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        fitsRequestedAt: { type: DataTypes.DATE, allowNull: true },
        fittedAt: { type: DataTypes.DATE, allowNull: true },
        importedBy: { type: DataTypes.UUID, allowNull: false },
        verifiedBy: { type: DataTypes.UUID, allowNull: true },
        submittedBy: { type: DataTypes.UUID, allowNull: true },
        decidedBy: { type: DataTypes.UUID, allowNull: true },
        importedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'plates', underscored: true, createdAt: false },
    );
  }
}
