import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A screening campaign: its neuron preset, QC thresholds and exposures of interest. */
export class Screen extends Model<InferAttributes<Screen>, InferCreationAttributes<Screen>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare description: CreationOptional<string>;
  declare neuronPreset: string;
  declare zPrimeMin: CreationOptional<number>;
  declare sealResistanceMin_GOhm: CreationOptional<number>;
  declare controlCurrentMin_pA: CreationOptional<number>;
  declare seriesResistanceMax_MOhm: CreationOptional<number>;
  declare capacitanceMin_pF: CreationOptional<number>;
  declare capacitanceMax_pF: CreationOptional<number>;
  declare vehicleRundownMax_fraction: CreationOptional<number>;
  declare normaliseToReference: CreationOptional<boolean>;
  declare exposures_uM: CreationOptional<number[]>;
  declare createdBy: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    const double = (defaultValue: number) => ({ type: DataTypes.DOUBLE, allowNull: false, defaultValue });
    Screen.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        neuronPreset: { type: DataTypes.TEXT, allowNull: false },
        zPrimeMin: { ...double(0.5), field: 'z_prime_min' },
        sealResistanceMin_GOhm: { ...double(0.5), field: 'seal_resistance_min_gohm' },
        controlCurrentMin_pA: { ...double(200), field: 'control_current_min_pa' },
        seriesResistanceMax_MOhm: { ...double(25), field: 'series_resistance_max_mohm' },
        capacitanceMin_pF: { ...double(1), field: 'capacitance_min_pf' },
        capacitanceMax_pF: { ...double(100), field: 'capacitance_max_pf' },
        vehicleRundownMax_fraction: { ...double(0.2), field: 'vehicle_rundown_max_fraction' },
        normaliseToReference: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        exposures_uM: {
          type: DataTypes.ARRAY(DataTypes.DOUBLE),
          allowNull: false,
          defaultValue: [],
          field: 'exposures_um',
        },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'screens', underscored: true },
    );
  }
}
