// Plate and compound exports on the real database: every table, the caution, the plate's state and its
// signatures, in the xlsx workbook and as csv. The workbook is read back with the same xlsx package.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import * as XLSX from 'xlsx';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { csvText, workbookBytes } from '@/lib/exports/document';
import { compoundExport } from '@/lib/exports/compound-export';
import { plateExport } from '@/lib/exports/plate-export';
import { auditedExportResponse, exportResponse } from '@/lib/exports/respond';
import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';
import { closeForecastPool } from '@/lib/compute/forecast-pool';
import { compoundExportQuerySchema, plateExportQuerySchema } from '@/lib/validation/exports';
import { AuditEvent, Compound, Forecast, Signature, SignoffEvent } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { importDemoPlate } from '../support/demo-plates';
import { makeDemoScreens } from '../support/demo-scenario';

const sheetRows = (bytes: Buffer, name: string) =>
  XLSX.utils.sheet_to_json<unknown[]>(XLSX.read(bytes).Sheets[name]!, { header: 1, defval: null });

describe('exports', () => {
  let reader: Actor;
  let chemist: Actor;
  let plateId: string;

  beforeAll(async () => {
    await resetDatabase();
    chemist = await makeActor(['chemist']);
    const screens = await makeDemoScreens(await makeActor(['admin']), chemist);
    plateId = await importDemoPlate(await makeActor(['biologist']), screens, 'nav-96-plate-01.xlsx');
    reader = await makeActor(['approver']);
    // Sign-off belongs to its own service; here one signed step is written directly to test that exports carry it.
    const signature = await Signature.create({
      signerId: chemist.id,
      meaning: 'Compound map verified',
      comment: 'map matches the plate log',
      entityType: 'plate',
      entityId: plateId,
      contentSha256: 'a'.repeat(64),
    });
    await SignoffEvent.create({
      plateId,
      signatureId: signature.id,
      fromState: 'imported',
      toState: 'verified',
    });
    await db().query("update plates set state = 'verified' where id = :plateId", {
      replacements: { plateId },
    });
  });
  afterAll(async () => {
    await closeForecastPool();
    await db().close();
  });

  // Runs before the workbook, which stores the plate's forecasts: here none is stored yet.
  test('a csv of the wells alone computes and stores no forecast', async () => {
    const stored = () => Forecast.count({ where: { plateId } });
    expect(await stored()).toBe(0);
    const { document } = await plateExport(reader, plateId, ['wells']);
    expect(document.tables.map((t) => t.key)).toEqual(['wells']);
    expect(document.tables[0]!.rows).toHaveLength(96);
    expect(await stored()).toBe(0);
    // The forecast table, asked for, is made and stores what it computed (five compounds on NAV-P01).
    const forecastOnly = await plateExport(reader, plateId, ['forecast']);
    expect(forecastOnly.document.tables.map((t) => t.key)).toEqual(['forecast']);
    expect(await stored()).toBe(5);
  });

  test('the plate workbook: about sheet with caution, state and signature, then sign-off, wells, fits and forecast', async () => {
    const { label, document } = await plateExport(reader, plateId);
    expect(label).toBe('NAV-P01');
    const bytes = workbookBytes(document);
    expect(XLSX.read(bytes).SheetNames).toEqual([
      'About this export',
      'Sign-off',
      'Wells',
      'Fits',
      'Forecast at exposures',
    ]);
    const about = Object.fromEntries(sheetRows(bytes, 'About this export').map((r) => [r[0], r[1]]));
    expect(about).toMatchObject({
      Caution: FORECAST_CAUTION,
      Plate: 'NAV-P01',
      State: 'Map verified',
      Screen: 'Pain sodium screen',
      'Exposures (µM)': '0.1, 1',
    });
    expect(about['Signature 1']).toMatch(
      /^Imported → Map verified, signed by Test chemist <chemist-.+> at \d{4}-.+Z meaning “Compound map verified”, comment “map matches the plate log”$/,
    );
    expect(sheetRows(bytes, 'Sign-off')[1]).toEqual([
      'NAV-P01',
      'Imported',
      'Map verified',
      'Test chemist',
      chemist.email,
      'Compound map verified',
      'map matches the plate log',
      expect.any(String),
      'a'.repeat(64),
    ]);
    expect(sheetRows(bytes, 'Wells')).toHaveLength(1 + 96);
    const fits = sheetRows(bytes, 'Fits');
    expect(fits[0]!.slice(0, 7)).toEqual([
      'Compound',
      'Target',
      'Readout',
      'Conductance',
      'Model',
      'Status',
      'IC50 (µM)',
    ]);
    // One readout per target on this screen: every well and fit is the tonic one.
    expect(new Set(fits.slice(1).map((r) => r[2]))).toEqual(new Set(['tonic']));
    expect(sheetRows(bytes, 'Wells')[0]!.slice(4, 6)).toEqual(['Target', 'Readout']);
    expect(fits.slice(1).map((r) => r[0])).toEqual(['GW-0001', 'GW-0002', 'GW-0003', 'GW-0004', 'GW-0005']);
    const forecast = sheetRows(bytes, 'Forecast at exposures');
    expect(forecast[0]).toEqual([
      `Caution: ${FORECAST_CAUTION}`,
      ...Array(forecast[2]!.length - 1).fill(null),
    ]);
    // Five compounds, each with control and the screen's two exposures.
    expect(forecast.slice(3).map((r) => `${r[0]} ${r[3]} ${r[4]}`)).toHaveLength(15);
    expect(forecast[4]!.slice(3, 6)).toEqual(['Exposure', 0.1, 'tonic only']);
  });

  test('a csv of one table starts with the same about lines and the caution', async () => {
    const { document } = await plateExport(reader, plateId);
    const csv = csvText(
      document,
      document.tables.find((t) => t.key === 'fits')!,
    );
    expect(csv.startsWith('\uFEFFGatewell export,"Plate NAV-P01: wells, fits and forecast"\r\n')).toBe(true);
    expect(csv).toContain(`\r\nCaution,${FORECAST_CAUTION}\r\n`);
    expect(csv).toContain('\r\nState,Map verified\r\n');
    expect(csv).toContain('\r\n\r\nCompound,Target,Readout,Conductance,Model,Status,IC50 (µM)');
    const response = exportResponse(document, { format: 'csv', table: 'wells' }, 'gatewell-plate-NAV-P01');
    expect(response.headers.get('content-disposition')).toBe(
      'attachment; filename="gatewell-plate-NAV-P01-wells.csv"',
    );
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8');
  });

  test('a download is an audit event first: who, which record, which form, file and rows of each table', async () => {
    const { document } = await plateExport(reader, plateId);
    const before = await AuditEvent.count({ where: { action: 'export' } });
    const workbook = await auditedExportResponse(
      reader,
      document,
      { format: 'xlsx' },
      'gatewell-plate-NAV-P01',
      { entityType: 'plate', entityId: plateId },
    );
    expect(workbook.headers.get('content-disposition')).toBe(
      'attachment; filename="gatewell-plate-NAV-P01.xlsx"',
    );
    await auditedExportResponse(
      reader,
      document,
      { format: 'csv', table: 'wells' },
      'gatewell-plate-NAV-P01',
      { entityType: 'plate', entityId: plateId },
    );
    const events = await AuditEvent.findAll({ where: { action: 'export' }, order: [['id', 'ASC']] });
    expect(events).toHaveLength(before + 2);
    expect(
      events
        .slice(-2)
        .map((e) => ({ actorId: e.actorId, entityType: e.entityType, entityId: e.entityId, after: e.after })),
    ).toEqual([
      {
        actorId: reader.id,
        entityType: 'plate',
        entityId: plateId,
        after: {
          format: 'xlsx',
          file: 'gatewell-plate-NAV-P01.xlsx',
          rows: { signoff: 1, wells: 96, fits: 5, forecast: expect.any(Number) },
        },
      },
      {
        actorId: reader.id,
        entityType: 'plate',
        entityId: plateId,
        after: { format: 'csv', file: 'gatewell-plate-NAV-P01-wells.csv', rows: { wells: 96 } },
      },
    ]);
  });

  test('csv fields: quotes, line breaks and text a spreadsheet would run as a formula', () => {
    const doc = {
      about: [['Note', 'a "quoted", text'] as [string, string]],
      tables: [
        {
          sheet: 'T',
          key: 't',
          columns: ['A', 'B'],
          rows: [
            ['=1+1', 'two\nlines'],
            [-3, null],
            [true, '@x'],
          ],
        },
      ],
    };
    expect(csvText(doc, doc.tables[0]!)).toBe(
      '\uFEFFNote,"a ""quoted"", text"\r\n\r\nA,B\r\n\'=1+1,"two\nlines"\r\n-3,\r\nyes,\'@x\r\n',
    );
  });

  test('the compound profile export: every fit marked approved or not, selectivity, forecast and signatures by plate', async () => {
    const compound = await Compound.findOne({ where: { identifier: 'GW-0002' } });
    const { identifier, document } = await compoundExport(reader, compound!.id);
    expect(identifier).toBe('GW-0002');
    const bytes = workbookBytes(document);
    expect(XLSX.read(bytes).SheetNames).toEqual([
      'About this export',
      'Potency across plates',
      'Selectivity',
      'Forecast at exposures',
      'Sign-off',
    ]);
    const about = Object.fromEntries(sheetRows(bytes, 'About this export').map((r) => [r[0], r[1]]));
    expect(about).toMatchObject({
      Caution: FORECAST_CAUTION,
      Compound: 'GW-0002',
      'Plate NAV-P01': 'Pain sodium screen; state Map verified (not yet approved)',
    });
    expect(about['Signature 1']).toMatch(/^NAV-P01: Imported → Map verified, signed by Test chemist/);
    const potency = sheetRows(bytes, 'Potency across plates');
    expect(potency[3]!.slice(0, 5)).toEqual([
      'NAV-P01',
      'Pain sodium screen',
      'Map verified',
      'no, not yet approved',
      'Nav1.7',
    ]);
    expect(
      sheetRows(bytes, 'Forecast at exposures')
        .slice(3)
        .map((r) => r[3]),
    ).toEqual(['Control', 'Exposure', 'Exposure']);
  });

  test('bad export queries get clear messages', () => {
    expect(plateExportQuerySchema.safeParse({ format: 'csv' }).error!.issues[0]!.message).toBe(
      'A csv file holds one table: add table=wells, fits, forecast, signoff.',
    );
    expect(plateExportQuerySchema.safeParse({ format: 'pdf' }).error!.issues[0]!.message).toBe(
      'format must be xlsx or csv.',
    );
    expect(
      compoundExportQuerySchema.safeParse({ format: 'csv', table: 'wells' }).error!.issues[0]!.message,
    ).toBe('table must be one of: potency, selectivity, forecast, signoff.');
    expect(plateExportQuerySchema.parse({})).toEqual({ format: 'xlsx' });
  });
});
