import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { GRID_NAMES, type GridColumnChoice, type GridName } from '@/lib/domain/grid-layouts';

/** One person's layout of one grid (lib/preferences/grid-layouts.ts); no row means the grid's own. */
export class GridLayout extends Model<InferAttributes<GridLayout>, InferCreationAttributes<GridLayout>> {
  declare userId: string;
  declare grid: GridName;
  declare columns: GridColumnChoice[];
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): void {
    GridLayout.init(
      {
        userId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        grid: {
          type: DataTypes.TEXT,
          allowNull: false,
          primaryKey: true,
          validate: { isIn: [GRID_NAMES as unknown as string[]] },
        },
        columns: { type: DataTypes.JSONB, allowNull: false },
        updatedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'user_grid_layouts', underscored: true, timestamps: false },
    );
  }
}
