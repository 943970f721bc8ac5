import 'server-only';
import { UniqueConstraintError } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import {
  blockableConductances,
  conductanceByPresetSchema,
  conductanceInPreset,
  initialConductanceByPreset,
  targetReadoutNames,
  type ScreenInput,
  type TargetInput,
  type TargetMappingInput,
} from '@/lib/validation/screens';
import { Screen, Target } from '@/models';

function columns(input: ScreenInput) {
  const { vehicleRundownMax_percent, ...rest } = input;
  return { ...rest, vehicleRundownMax_fraction: vehicleRundownMax_percent / 100 };
}

function plainScreen(screen: Screen) {
  const { createdAt: _c, updatedAt: _u, ...rest } = screen.get({ plain: true });
  return rest;
}

function conflict(error: unknown, message: string, field: string): never {
  if (error instanceof UniqueConstraintError)
    throw new AppError('conflict', message, { fieldErrors: { [field]: [message] } });
  throw error;
}

/** Creates a screen with its QC thresholds (admin). */
export async function createScreen(actor: Actor, input: ScreenInput): Promise<{ id: string }> {
  requireCapability(actor, 'manageScreens');
  return db().transaction(async (transaction) => {
    const screen = await Screen.create({ ...columns(input), createdBy: actor.id }, { transaction }).catch(
      (e) => conflict(e, `A screen named ${input.name} already exists.`, 'name'),
    );
    await recordAudit(
      {
        actorId: actor.id,
        action: 'create',
        entityType: 'screen',
        entityId: screen.id,
        after: plainScreen(screen),
        address: actor.address,
      },
      transaction,
    );
    return { id: screen.id };
  });
}

/** Changes a screen's description, preset, thresholds or exposures (admin); plates keep their stored QC. */
export async function updateScreen(actor: Actor, screenId: string, input: ScreenInput): Promise<void> {
  requireCapability(actor, 'manageScreens');
  await db().transaction(async (transaction) => {
    const screen = await Screen.findByPk(screenId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!screen) throw new AppError('not_found', 'No such screen.');
    const targets = await Target.findAll({ where: { screenId }, transaction, lock: transaction.LOCK.UPDATE });
    // Each target's conductance in the (possibly new) preset: its stored mapping there, else the default
    // for its name. A target with neither blocks the change, and nothing is written.
    const next = targets.map((t) => ({ target: t, conductance: conductanceInPreset(t, input.neuronPreset) }));
    const orphan = next.find((n) => n.conductance === null);
    if (orphan) {
      const t = orphan.target;
      const allowed = blockableConductances(input.neuronPreset);
      const message = `Target ${t.name} (${t.conductance} in ${screen.neuronPreset}) has no conductance in ${input.neuronPreset}; it has ${allowed.join(', ')}.`;
      throw new AppError('invalid', message, { fieldErrors: { neuronPreset: [message] } });
    }
    if (input.neuronPreset !== screen.neuronPreset) {
      for (const { target, conductance } of next) {
        const before = { conductance: target.conductance, conductanceByPreset: target.conductanceByPreset };
        const conductanceByPreset = conductanceByPresetSchema.parse({
          ...target.conductanceByPreset,
          [screen.neuronPreset]: target.conductance,
          [input.neuronPreset]: conductance!,
        });
        await target.update({ conductance: conductance!, conductanceByPreset }, { transaction });
        await recordAudit(
          {
            actorId: actor.id,
            action: 'update',
            entityType: 'target',
            entityId: target.id,
            before,
            after: { conductance: target.conductance, conductanceByPreset },
            address: actor.address,
          },
          transaction,
        );
      }
    }
    const before = plainScreen(screen);
    await screen
      .update(columns(input), { transaction })
      .catch((e) => conflict(e, `A screen named ${input.name} already exists.`, 'name'));
    await recordAudit(
      {
        actorId: actor.id,
        action: 'update',
        entityType: 'screen',
        entityId: screenId,
        before,
        after: plainScreen(screen),
        address: actor.address,
      },
      transaction,
    );
  });
}

/** Adds a target to a screen, mapped to a blockable conductance of the screen's preset (admin). */
export async function addTarget(actor: Actor, screenId: string, input: TargetInput): Promise<{ id: string }> {
  requireCapability(actor, 'manageScreens');
  return db().transaction(async (transaction) => {
    const screen = await Screen.findByPk(screenId, { transaction });
    if (!screen) throw new AppError('not_found', 'No such screen.');
    const allowed = blockableConductances(screen.neuronPreset);
    if (!allowed.includes(input.conductance)) {
      const message = `${screen.neuronPreset} has no blockable conductance ${input.conductance}; choose one of ${allowed.join(', ')}.`;
      throw new AppError('invalid', message, { fieldErrors: { conductance: [message] } });
    }
    const conductanceByPreset = initialConductanceByPreset(
      input.name,
      screen.neuronPreset,
      input.conductance,
    );
    const { tonicReadoutName, useDependentReadoutName, ...fields } = input;
    const blockReadouts = targetReadoutNames({ tonicReadoutName, useDependentReadoutName });
    const target = await Target.create(
      { ...fields, blockReadouts, conductanceByPreset, screenId },
      { transaction },
    ).catch((e) => conflict(e, `This screen already has a target named ${input.name}.`, 'name'));
    await recordAudit(
      {
        actorId: actor.id,
        action: 'create',
        entityType: 'target',
        entityId: target.id,
        after: { screenId, ...fields, blockReadouts, conductanceByPreset },
        address: actor.address,
      },
      transaction,
    );
    return { id: target.id };
  });
}

/**
 * Sets a target's conductance in a preset other than its screen's current one (admin), used if the
 * screen later switches to that preset. The current preset's mapping is the one fits and forecasts
 * read; it is chosen when the target is added and is not changed here.
 */
export async function setTargetMapping(
  actor: Actor,
  targetId: string,
  input: TargetMappingInput,
): Promise<void> {
  requireCapability(actor, 'manageScreens');
  await db().transaction(async (transaction) => {
    const target = await Target.findByPk(targetId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!target) throw new AppError('not_found', 'No such target.');
    const screen = await Screen.findByPk(target.screenId, { transaction });
    if (!screen) throw new AppError('not_found', 'No such screen.');
    if (input.preset === screen.neuronPreset) {
      const message = `${input.preset} is the screen’s current preset; its mapping is fixed when the target is added.`;
      throw new AppError('invalid', message, { fieldErrors: { preset: [message] } });
    }
    const allowed = blockableConductances(input.preset);
    if (!allowed.includes(input.conductance)) {
      const message = `${input.preset} has no blockable conductance ${input.conductance}; choose one of ${allowed.join(', ')}.`;
      throw new AppError('invalid', message, { fieldErrors: { conductance: [message] } });
    }
    const before = { conductanceByPreset: target.conductanceByPreset };
    const conductanceByPreset = conductanceByPresetSchema.parse({
      ...target.conductanceByPreset,
      [input.preset]: input.conductance,
    });
    await target.update({ conductanceByPreset }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'update',
        entityType: 'target',
        entityId: target.id,
        before,
        after: { conductanceByPreset },
        address: actor.address,
      },
      transaction,
    );
  });
}
