import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import type { TargetReadoutNames } from '@/lib/domain/fits';
import type { ScreenQcLimits } from '@/lib/domain/readouts';
import { AppError } from '@/lib/errors';
import { PRESET_NAMES } from '@/lib/science/neuron/presets';
import { conductanceInPreset } from '@/lib/validation/screens';
import { Screen, Target } from '@/models';

export interface ScreenDetail extends Omit<ScreenQcLimits, 'normaliseToReference'> {
  id: string;
  name: string;
  description: string;
  neuronPreset: string;
  exposures_uM: number[];
  targets: {
    id: string;
    name: string;
    conductance: string;
    /** The names of its block readouts ({}: one readout, the tonic one). */
    blockReadouts: TargetReadoutNames;
    /** The target's conductance in every preset (stored, else the default for its name), null where none. */
    byPreset: { preset: string; conductance: string | null }[];
  }[];
}

/** Screens with their targets and QC thresholds, by name. */
export async function listScreens(actor: Actor): Promise<ScreenDetail[]> {
  void actor; // every signed-in role may read screens
  db();
  const screens = await Screen.findAll({
    include: [{ model: Target, as: 'targets' }],
    order: [
      ['name', 'ASC'],
      [{ model: Target, as: 'targets' }, 'name', 'ASC'],
    ],
  });
  return screens.map(toDetail);
}

/** One screen with its targets, or not_found. */
export async function getScreen(actor: Actor, screenId: string): Promise<ScreenDetail> {
  void actor; // every signed-in role may read screens
  db();
  const screen = await Screen.findByPk(screenId, {
    include: [{ model: Target, as: 'targets' }],
    order: [[{ model: Target, as: 'targets' }, 'name', 'ASC']],
  });
  if (!screen) throw new AppError('not_found', 'No such screen.');
  return toDetail(screen);
}

function toDetail(screen: Screen): ScreenDetail {
  const plain = screen.get({ plain: true }) as Screen & { targets: Target[] };
  return {
    id: plain.id,
    name: plain.name,
    description: plain.description,
    neuronPreset: plain.neuronPreset,
    zPrimeMin: plain.zPrimeMin,
    sealResistanceMin_GOhm: plain.sealResistanceMin_GOhm,
    controlCurrentMin_pA: plain.controlCurrentMin_pA,
    seriesResistanceMax_MOhm: plain.seriesResistanceMax_MOhm,
    capacitanceMin_pF: plain.capacitanceMin_pF,
    capacitanceMax_pF: plain.capacitanceMax_pF,
    vehicleRundownMax_fraction: plain.vehicleRundownMax_fraction,
    exposures_uM: plain.exposures_uM,
    targets: plain.targets.map((t) => ({
      id: t.id,
      name: t.name,
      conductance: t.conductance,
      blockReadouts: t.blockReadouts ?? {},
      byPreset: PRESET_NAMES.map((preset) => ({
        preset,
        conductance: preset === plain.neuronPreset ? t.conductance : conductanceInPreset(t, preset),
      })),
    })),
  };
}
