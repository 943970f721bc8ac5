import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { getCompoundProfile, type CompoundProfile } from '@/lib/compounds/profile';
import { READOUT_RATIO_MEANING, readoutText } from '@/lib/domain/fits';
import { PLATE_STATE_LABEL } from '@/lib/domain/plate-states';
import { getCompoundForecast } from '@/lib/forecasts/compound-forecast';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import type { Cell, ExportDocument, ExportTable } from './document';
import { forecastTable } from './forecast-rows';
import { listPlateSignoffs, signoffLines, signoffTable } from './signoffs';

function potencyTable(profile: CompoundProfile): ExportTable {
  const standing = new Set(profile.potencies.map((p) => p.fitId));
  // The use-dependence ratio on the rows of both fits it comes from.
  const ratioOf = new Map(
    profile.useDependence.flatMap((u) => [
      [u.tonic.fitId, u.ratio],
      [u.useDependent.fitId, u.ratio],
    ]),
  );
  return {
    sheet: 'Potency across plates',
    key: 'potency',
    columns: [
      'Plate',
      'Screen',
      'Plate state',
      'Approved',
      'Target',
      'Readout',
      'Conductance',
      'Model',
      'Status',
      'IC50 (µM)',
      'IC50 95 % CI low (µM)',
      'IC50 95 % CI high (µM)',
      'IC50 above (µM)',
      'Hill slope',
      'R²',
      'Wells used',
      'Stands for the target in this profile',
      'Message',
      'Tonic IC50 ÷ use-dependent IC50',
    ],
    rows: profile.fits.map((f) => [
      f.plateLabel,
      f.screenName,
      PLATE_STATE_LABEL[f.plateState],
      f.approved ? 'yes' : 'no, not yet approved',
      f.target,
      readoutText(f.readout, f.readoutName),
      f.conductance,
      f.model === 'hill2' ? '2 parameters' : '4 parameters',
      f.status,
      f.ic50_uM,
      f.ic50CiLow_uM,
      f.ic50CiHigh_uM,
      f.ic50LowerBound_uM,
      f.hill,
      f.r2,
      f.n,
      standing.has(f.fitId),
      f.message,
      ratioOf.get(f.fitId) ?? null,
    ]),
    note: `Only fits on approved plates are results; fits on plates not yet approved are marked so.${profile.useDependence.length ? ` ${READOUT_RATIO_MEANING}` : ''}`,
  };
}

function selectivityTable(profile: CompoundProfile): ExportTable {
  return {
    sheet: 'Selectivity',
    key: 'selectivity',
    columns: [
      'IC50 ratio',
      'Numerator target',
      'Denominator target',
      'Relation',
      'Ratio',
      'Meaning',
      'Both from approved plates',
    ],
    rows: profile.selectivity.map((r) => [
      r.text,
      r.numerator,
      r.denominator,
      r.relation === 'undetermined' ? 'not determined' : r.relation,
      r.ratio,
      r.meaning,
      r.approved,
    ]),
  };
}

/**
 * A compound profile's export: about lines (caution, each plate's state and every signature), then
 * potency across plates, selectivity, the forecast at exposure and the plates' sign-off.
 */
export async function compoundExport(
  actor: Actor,
  compoundId: string,
): Promise<{ identifier: string; document: ExportDocument }> {
  const profile = await getCompoundProfile(actor, compoundId);
  const plates = [...new Map(profile.fits.map((f) => [f.plateId, f])).values()];
  const signoffs = await listPlateSignoffs(plates.map((p) => p.plateId));
  const forecasts = profile.screens.length ? [await getCompoundForecast(actor, compoundId)] : [];
  const about: [string, Cell][] = [
    ['Gatewell export', `Compound profile of ${profile.compound.identifier}`],
    ['Caution', FORECAST_CAUTION],
    ['Compound', profile.compound.identifier],
    ['Name', profile.compound.name],
    [
      'Potency basis',
      'Per target, the newest fit on an approved plate; without one, the newest fit on a plate not yet approved (marked so).',
    ],
    ...plates.map((p): [string, Cell] => [
      `Plate ${p.plateLabel}`,
      `${p.screenName}; state ${PLATE_STATE_LABEL[p.plateState]}${p.approved ? '' : ' (not yet approved)'}`,
    ]),
    ['Exported by', `${actor.name} <${actor.email}>`],
    ['Exported at (UTC)', new Date().toISOString().replace(/\.\d+Z$/, 'Z')],
    ...(plates.length ? signoffLines(signoffs, true) : []),
  ];
  return {
    identifier: profile.compound.identifier,
    document: {
      about,
      tables: [
        potencyTable(profile),
        selectivityTable(profile),
        forecastTable(forecasts, FORECAST_CAUTION),
        signoffTable(signoffs),
      ],
    },
  };
}
