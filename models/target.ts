import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { TargetReadoutNames } from '@/lib/domain/fits';

/**
 * A current measured in a screen, mapped to one conductance of the screen's neuron preset
 * (`conductance`), and to a conductance of each other preset it has been given or defaulted to
 * (`conductanceByPreset`, preset name → conductance), used when the screen's preset changes.
 */
export class Target extends Model<InferAttributes<Target>, InferCreationAttributes<Target>> {
  declare id: CreationOptional<string>;
  declare screenId: string;
  declare name: string;
  declare conductance: string;
  declare conductanceByPreset: CreationOptional<Record<string, string>>;
  declare description: CreationOptional<string>;
  /** The names of the target's block readouts ({}: one readout, the tonic one). */
  declare blockReadouts: CreationOptional<TargetReadoutNames>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Target.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        screenId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        conductance: { type: DataTypes.TEXT, allowNull: false },
        conductanceByPreset: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        blockReadouts: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'targets', underscored: true },
    );
  }
}
