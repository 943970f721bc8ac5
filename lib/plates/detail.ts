import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { AppError } from '@/lib/errors';
import { Target } from '@/models';
import {
  selectPlateFits,
  selectPlateHeader,
  selectPlateWells,
  type FitRow,
  type PlateHeader,
  type WellRow,
} from './queries';

export type { FitRow, PlateHeader, WellRow } from './queries';

/** A plate's header: screen, state, file and the QC summary per target. */
export async function getPlateHeader(actor: Actor, plateId: string): Promise<PlateHeader> {
  void actor; // every signed-in role may read plates
  const plate = await selectPlateHeader(plateId);
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const targets = await Target.findAll({
    attributes: ['id', 'name', 'conductance'],
    where: { screenId: plate.screenId },
    order: [['name', 'ASC']],
    raw: true,
  });
  return { ...plate, targets };
}

/** Every readout of the plate with its well, in plate order. */
export async function listPlateWells(actor: Actor, plateId: string): Promise<WellRow[]> {
  void actor;
  return selectPlateWells(plateId);
}

/** The plate's Hill fits, by compound and target. */
export async function listPlateFits(actor: Actor, plateId: string): Promise<FitRow[]> {
  void actor;
  return selectPlateFits(plateId);
}
