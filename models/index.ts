import 'server-only';
import type { Sequelize } from 'sequelize';
import * as registry from './registry';
import {
  AuditEvent,
  Batch,
  Compound,
  CompoundAlias,
  Fit,
  Plate,
  Readout,
  Screen,
  Signature,
  SignoffEvent,
  Target,
  UploadedFile,
  User,
  UserRole,
  Well,
} from './registry';

export * from './registry';

const models = Object.values(registry);

/** Registers every model and association on one Sequelize instance. */
export function initModels(sequelize: Sequelize): void {
  for (const model of models) model.initModel(sequelize);

  User.hasMany(UserRole, { foreignKey: 'userId', as: 'roles' });
  UserRole.belongsTo(User, { foreignKey: 'userId' });
  Screen.hasMany(Target, { foreignKey: 'screenId', as: 'targets' });
  Target.belongsTo(Screen, { foreignKey: 'screenId', as: 'screen' });
  Compound.hasMany(Batch, { foreignKey: 'compoundId', as: 'batches' });
  Batch.belongsTo(Compound, { foreignKey: 'compoundId', as: 'compound' });
  CompoundAlias.belongsTo(Compound, { foreignKey: 'compoundId', as: 'compound' });
  Plate.belongsTo(Screen, { foreignKey: 'screenId', as: 'screen' });
  Plate.belongsTo(UploadedFile, { foreignKey: 'uploadedFileId', as: 'file' });
  Plate.belongsTo(User, { foreignKey: 'importedBy', as: 'importer' });
  Plate.hasMany(Well, { foreignKey: 'plateId', as: 'wells' });
  Plate.hasMany(Fit, { foreignKey: 'plateId', as: 'fits' });
  Plate.hasMany(SignoffEvent, { foreignKey: 'plateId', as: 'signoffEvents' });
  Well.belongsTo(Plate, { foreignKey: 'plateId', as: 'plate' });
  Well.belongsTo(Compound, { foreignKey: 'compoundId', as: 'compound' });
  Well.hasMany(Readout, { foreignKey: 'wellId', as: 'readouts' });
  Readout.belongsTo(Well, { foreignKey: 'wellId', as: 'well' });
  Readout.belongsTo(Target, { foreignKey: 'targetId', as: 'target' });
  Fit.belongsTo(Compound, { foreignKey: 'compoundId', as: 'compound' });
  Fit.belongsTo(Target, { foreignKey: 'targetId', as: 'target' });
  Fit.belongsTo(Plate, { foreignKey: 'plateId', as: 'plate' });
  SignoffEvent.belongsTo(Signature, { foreignKey: 'signatureId', as: 'signature' });
  Signature.belongsTo(User, { foreignKey: 'signerId', as: 'signer' });
  AuditEvent.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
}
