import 'server-only';
import type { Transaction } from 'sequelize';
import type { HillModelName } from '@/lib/science/hill-model';
import { analysePlate, fitKey } from '@/lib/science/plate-analysis';
import { Fit, Plate, Readout, Screen, Well } from '@/models';
import { fitRow } from './fit-row';
import { analysisSettings } from './settings';

/**
 * Recomputes a plate's QC, block, Z′ and fits from its stored wells and readouts, inside the caller's
 * transaction, keeping each fit's chosen model unless `models` overrides it. Bumps the plate version.
 */
export async function recomputePlate(plate: Plate, actorId: string, transaction: Transaction, models: Record<string, HillModelName> = {}): Promise<void> {
  const screen = await Screen.findByPk(plate.screenId, { transaction, rejectOnEmpty: true });
  const wells = await Well.findAll({ where: { plateId: plate.id }, transaction });
  const readouts = await Readout.findAll({ where: { wellId: wells.map((w) => w.id) }, transaction });
  const previous = await Fit.findAll({ where: { plateId: plate.id }, transaction });
  const chosen = { ...Object.fromEntries(previous.map((f) => [fitKey(f.compoundId, f.targetId), f.model])), ...models };

  const analysis = analysePlate(
    wells.map((w) => ({
      id: w.id, role: w.role, compoundId: w.compoundId, concentration_uM: w.concentrationUm, sealResistance_GOhm: w.sealResistanceGohm,
      seriesResistance_MOhm: w.seriesResistanceMohm, capacitance_pF: w.capacitancePf, excluded: w.excluded,
    })),
    readouts.map((r) => ({ id: r.id, wellId: r.wellId, target: r.targetId, controlCurrent_pA: r.controlCurrentPa, compoundCurrent_pA: r.compoundCurrentPa })),
    analysisSettings(screen, chosen),
  );

  const byId = new Map(readouts.map((r) => [r.id, r]));
  for (const result of analysis.readouts) {
    const readout = byId.get(result.id)!;
    if (readout.fractionalBlock !== result.block || JSON.stringify(readout.qcReasons) !== JSON.stringify(result.qcReasons)) {
      await readout.update({ fractionalBlock: result.block, qcReasons: result.qcReasons }, { transaction });
    }
  }
  await Fit.destroy({ where: { plateId: plate.id }, transaction });
  await Fit.bulkCreate(analysis.fits.map((f) => fitRow(f, { plateId: plate.id, compoundId: f.compoundId, targetId: f.target, computedBy: actorId })), { transaction });
  await plate.update({ qcSummary: analysis.targets, version: plate.version + 1 }, { transaction });
}
