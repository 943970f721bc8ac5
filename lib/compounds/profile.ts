import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { Compound, Screen } from '@/models';
import {
  choosePotencies,
  listCompoundFits,
  pairUseDependence,
  type ProfileFit,
  type UseDependence,
} from './profile-fits';
import { selectivityRatios, type SelectivityRatio } from './selectivity';

export interface ProfileScreen {
  id: string;
  name: string;
  neuronPreset: string;
  exposures_uM: number[];
  /** The compound has at least one fit on an approved plate of this screen. */
  hasApproved: boolean;
}

export interface CompoundProfile {
  compound: { id: string; identifier: string; name: string };
  fits: ProfileFit[];
  /** The fit standing for each target's potency (approved plates first, then the newest plate). */
  potencies: ProfileFit[];
  selectivity: SelectivityRatio[];
  /** Targets whose standing plate fitted both readouts: tonic and use-dependent IC50 and their ratio. */
  useDependence: UseDependence[];
  screens: ProfileScreen[];
}

/** A compound's results across plates and screens: every fit, the potency per target and selectivity. */
export async function getCompoundProfile(actor: Actor, compoundId: string): Promise<CompoundProfile> {
  db();
  const compound: CompoundProfile['compound'] | null = await Compound.findByPk(compoundId, {
    attributes: ['id', 'identifier', 'name'],
    raw: true,
  });
  if (!compound) throw new AppError('not_found', 'No such compound.');
  const fits = await listCompoundFits(actor, compoundId);
  const potencies = [...choosePotencies(fits).values()].sort((a, b) => a.target.localeCompare(b.target));
  const screenIds = [...new Set(fits.map((f) => f.screenId))];
  const screens = screenIds.length
    ? await Screen.findAll({
        attributes: ['id', 'name', 'neuronPreset', 'exposures_uM'],
        where: { id: screenIds },
        order: [['name', 'ASC']],
        raw: true,
      })
    : [];
  return {
    compound,
    fits,
    potencies,
    selectivity: selectivityRatios(potencies),
    useDependence: pairUseDependence(potencies, fits),
    screens: screens.map((s) => ({
      ...s,
      exposures_uM: [...s.exposures_uM].sort((a, b) => a - b),
      hasApproved: fits.some((f) => f.screenId === s.id && f.approved),
    })),
  };
}

/** Fits shown on one page of a compound's profile (our choice, as the plate list's 50). */
export const PROFILE_FITS_PAGE_SIZE = 50;

export interface CompoundProfilePage extends Omit<CompoundProfile, 'fits'> {
  /** The fits of this page only, in the profile's order (approved plates first, then newest first). */
  fits: ProfileFit[];
  fitCount: number;
  approvedCount: number;
  /** 1-based, within 1 … pages. */
  page: number;
  pages: number;
}

/**
 * A compound's profile with one page of its fits: potencies, selectivity and screens come from every fit,
 * the table from this page's 50, so that a compound tested on hundreds of plates stays a small page.
 * A page past the last shows the last.
 */
export async function getCompoundProfilePage(
  actor: Actor,
  compoundId: string,
  page: number,
  pageSize = PROFILE_FITS_PAGE_SIZE,
): Promise<CompoundProfilePage> {
  const profile = await getCompoundProfile(actor, compoundId);
  const pages = Math.max(1, Math.ceil(profile.fits.length / pageSize));
  const shown = Math.min(Math.max(1, Math.trunc(page) || 1), pages);
  return {
    ...profile,
    fits: profile.fits.slice((shown - 1) * pageSize, shown * pageSize),
    fitCount: profile.fits.length,
    approvedCount: profile.fits.filter((f) => f.approved).length,
    page: shown,
    pages,
  };
}
