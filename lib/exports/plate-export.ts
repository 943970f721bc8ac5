import 'server-only';
import type { Actor } from '@/lib/auth/roles';
import { readoutText } from '@/lib/domain/fits';
import { PLATE_STATE_LABEL } from '@/lib/domain/plate-states';
import { listPlateForecasts, getPlateForecast } from '@/lib/forecasts/plate-forecast';
import { getPlateHeader, listPlateFits, listPlateWells } from '@/lib/plates/detail';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import { PLATE_EXPORT_TABLES } from '@/lib/validation/exports';
import type { ExportDocument, ExportTable } from './document';
import { forecastTable } from './forecast-rows';
import { listPlateSignoffs, signoffLines, signoffTable } from './signoffs';

type PlateExportTable = (typeof PLATE_EXPORT_TABLES)[number];

const FIT_STATUS_WORDS: Record<string, string> = {
  fitted: 'Fitted',
  above_range: 'IC50 above the tested range',
  inactive: 'Inactive',
  insufficient: 'Too few concentrations',
  not_converged: 'Did not converge',
};

function wellsTable(wells: Awaited<ReturnType<typeof listPlateWells>>): ExportTable {
  return {
    sheet: 'Wells',
    key: 'wells',
    columns: [
      'Well',
      'Role',
      'Compound',
      'Concentration (µM)',
      'Target',
      'Readout',
      'Control current (pA)',
      'Compound current (pA)',
      'Fractional block',
      'Seal resistance (GΩ)',
      'Series resistance (MΩ)',
      'Capacitance (pF)',
      'QC',
      'Excluded',
      'Exclusion reason',
    ],
    rows: wells.map((w) => [
      w.position,
      w.role,
      w.compound,
      w.concentration_uM,
      w.target,
      readoutText(w.readout),
      w.controlCurrent_pA,
      w.compoundCurrent_pA,
      w.fractionalBlock,
      w.sealResistance_GOhm,
      w.seriesResistance_MOhm,
      w.capacitance_pF,
      w.qcReasons.length ? w.qcReasons.map((q) => q.message).join(' ') : 'pass',
      w.excluded,
      w.exclusionReason,
    ]),
  };
}

function fitsTable(fits: Awaited<ReturnType<typeof listPlateFits>>): ExportTable {
  return {
    sheet: 'Fits',
    key: 'fits',
    columns: [
      'Compound',
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
      'Bottom',
      'Top',
      'R²',
      'Residual SD',
      'Wells used',
      'Message',
      'Flags',
    ],
    rows: fits.map((f) => [
      f.compound,
      f.target,
      readoutText(f.readout, f.readoutName),
      f.conductance,
      f.model === 'hill2' ? '2 parameters' : '4 parameters',
      FIT_STATUS_WORDS[f.status] ?? f.status,
      f.ic50_uM,
      f.ic50CiLow_uM,
      f.ic50CiHigh_uM,
      f.ic50LowerBound_uM,
      f.hill,
      f.bottom,
      f.top,
      f.r2,
      f.residualSd,
      f.n,
      f.message,
      f.flags.map((x) => x.message).join(' '),
    ]),
  };
}

/**
 * A plate's export: about lines (caution, plate, state, signatures), then sign-off, wells, fits and
 * the forecast of every compound at the exposures (stored forecasts reused, missing ones computed).
 * `tables` names the tables wanted (a csv file holds one): only a forecast table computes forecasts, so
 * that the wells or fits of a plate download at once and store nothing.
 */
export async function plateExport(
  actor: Actor,
  plateId: string,
  tables: readonly PlateExportTable[] = PLATE_EXPORT_TABLES,
): Promise<{ label: string; document: ExportDocument }> {
  const header = await getPlateHeader(actor, plateId);
  const [wells, fits, signoffs, list] = await Promise.all([
    listPlateWells(actor, plateId),
    listPlateFits(actor, plateId),
    listPlateSignoffs([plateId]),
    listPlateForecasts(actor, plateId),
  ]);
  // All at once: each missing forecast is a job on the queue, and the workers share the control's computation.
  const forecasts = tables.includes('forecast')
    ? await Promise.all(list.compounds.map((c) => getPlateForecast(actor, plateId, c.compoundId)))
    : [];
  const about: ExportDocument['about'] = [
    ['Gatewell export', `Plate ${header.label}: wells, fits and forecast`],
    ['Caution', FORECAST_CAUTION],
    ['Plate', header.label],
    ['State', PLATE_STATE_LABEL[header.state]],
    ['Plate version', header.version],
    [
      'Fits',
      header.fitsPending
        ? 'being recomputed after the last change: these are the fits before it; export again once the plate page shows them current'
        : 'current',
    ],
    ['Screen', header.screenName],
    ['Plate format (wells)', header.format],
    ['Imported by', header.importedByName],
    ['Imported at (UTC)', header.importedAt],
    ['Source file', header.filename],
    ['Source file SHA-256', header.sha256],
    ['Neuron preset', header.neuronPreset],
    ['Exposures (µM)', list.exposures_uM.join(', ')],
    ['Exported by', `${actor.name} <${actor.email}>`],
    ['Exported at (UTC)', new Date().toISOString().replace(/\.\d+Z$/, 'Z')],
    ...signoffLines(signoffs, false),
  ];
  return {
    label: header.label,
    document: {
      about,
      tables: [
        signoffTable(signoffs),
        wellsTable(wells),
        fitsTable(fits),
        ...(tables.includes('forecast') ? [forecastTable(forecasts, FORECAST_CAUTION)] : []),
      ].filter((table) => tables.includes(table.key as PlateExportTable)),
    },
  };
}
