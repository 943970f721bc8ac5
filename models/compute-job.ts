import 'server-only';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

import type { ComputeJobKind, ComputeJobState } from '@/lib/domain/jobs';

/** What Gatewell shows of one queued fit or forecast job; the id is the job's id on the queue. */
export class ComputeJob extends Model<InferAttributes<ComputeJob>, InferCreationAttributes<ComputeJob>> {
  declare id: string;
  declare kind: ComputeJobKind;
  /** The work it stands for (plate, or plate + forecast input): at most one queued job per key. */
  declare jobKey: string;
  declare plateId: string | null;
  /** Every plate stored from one file, the first being plateId (a file may hold several plates); null before. */
  declare plateIds: CreationOptional<string[] | null>;
  declare compoundId: string | null;
  declare requestedBy: string | null;
  declare state: CreationOptional<ComputeJobState>;
  declare done: CreationOptional<number>;
  declare total: CreationOptional<number | null>;
  declare message: CreationOptional<string | null>;
  declare attempts: CreationOptional<number>;
  declare worker: CreationOptional<string | null>;
  /** What a refused job leaves for the request waiting on it: the refusal's code and details. */
  declare outcome: CreationOptional<{ code: string; details: unknown } | null>;
  declare createdAt: CreationOptional<Date>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize): void {
    ComputeJob.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true },
        kind: { type: DataTypes.TEXT, allowNull: false },
        jobKey: { type: DataTypes.TEXT, allowNull: false },
        plateId: { type: DataTypes.UUID, allowNull: true },
        plateIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: true },
        compoundId: { type: DataTypes.UUID, allowNull: true },
        requestedBy: { type: DataTypes.UUID, allowNull: true },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
        done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        total: { type: DataTypes.INTEGER, allowNull: true },
        message: { type: DataTypes.TEXT, allowNull: true },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        worker: { type: DataTypes.TEXT, allowNull: true },
        outcome: { type: DataTypes.JSONB, allowNull: true },
        createdAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'compute_jobs', underscored: true, timestamps: false },
    );
  }
}
