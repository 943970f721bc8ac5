import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A screening campaign: its neuron preset, QC thresholds and exposures of interest. */
export class Screen extends Model<InferAttributes<Screen>, InferCreationAttributes<Screen>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare description: CreationOptional<string>;
  declare neuronPreset: string;
  declare zprimeMin: CreationOptional<number>;
  declare sealMinGohm: CreationOptional<number>;
  declare controlCurrentMinPa: CreationOptional<number>;
  declare seriesMaxMohm: CreationOptional<number>;
  declare capacitanceMinPf: CreationOptional<number>;
  declare capacitanceMaxPf: CreationOptional<number>;
  declare rundownMaxFraction: CreationOptional<number>;
  declare normaliseToReference: CreationOptional<boolean>;
  declare exposuresUm: CreationOptional<number[]>;
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
        zprimeMin: double(0.5),
        sealMinGohm: double(0.5),
        controlCurrentMinPa: double(200),
        seriesMaxMohm: double(25),
        capacitanceMinPf: double(1),
        capacitanceMaxPf: double(100),
        rundownMaxFraction: double(0.2),
        normaliseToReference: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        exposuresUm: { type: DataTypes.ARRAY(DataTypes.DOUBLE), allowNull: false, defaultValue: [] },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'screens', underscored: true },
    );
  }
}
