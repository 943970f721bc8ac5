import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A stored excitability forecast for one compound, keyed by the SHA-256 of its input. */
export class Forecast extends Model<InferAttributes<Forecast>, InferCreationAttributes<Forecast>> {
  declare id: CreationOptional<string>;
  declare plateId: string | null;
  declare compoundId: string;
  declare screenId: string;
  declare preset: string;
  declare inputSha256: string;
  declare input: Record<string, unknown>;
  declare result: Record<string, unknown>;
  declare computedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    Forecast.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        plateId: { type: DataTypes.UUID, allowNull: true },
        compoundId: { type: DataTypes.UUID, allowNull: false },
        screenId: { type: DataTypes.UUID, allowNull: false },
        preset: { type: DataTypes.TEXT, allowNull: false },
        inputSha256: { type: DataTypes.CHAR(64), allowNull: false, field: 'input_sha256' },
        input: { type: DataTypes.JSONB, allowNull: false },
        result: { type: DataTypes.JSONB, allowNull: false },
        computedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'forecasts', underscored: true, timestamps: false },
    );
  }
}
