// An approved plate is locked against every path that writes plate data. Each path below is called on an
// approved plate and must be refused (or do nothing) with nothing written: the plate row, its wells,
// readouts and fits, its audit events and its data hash are compared before and after. The list of paths
// is checked against what the code exports and against every changing route handler and server action,
// so a new write path fails here until it is added with its own check.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { contentSha256 } from '@/lib/auth/canonical-json';
import * as compoundService from '@/lib/compounds/service';
import { db } from '@/lib/db';
import * as plateRun from '@/lib/forecasts/plate-run';
import { listPlateFits, listPlateWells } from '@/lib/plates/detail';
import * as importService from '@/lib/plates/import-service';
import * as recompute from '@/lib/plates/recompute';
import * as review from '@/lib/plates/review';
import * as store from '@/lib/plates/store';
import * as screenService from '@/lib/screens/service';
import { plateContent } from '@/lib/signoff/plate-content';
import * as signoff from '@/lib/signoff/service';
import { screenSchema } from '@/lib/validation/screens';
import { Plate } from '@/models';
import { resetDatabase } from '../support/database';
import { demoCommitRequest } from '../support/demo-plates';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';

/**
 * Every exported function of the modules that write plates, wells, readouts or fits, and what it is. A
 * `write` is called on the approved plate in the test of the same name below; the rest say why not.
 */
const MODULE_EXPORTS: Record<string, [Record<string, unknown>, Record<string, string>]> = {
  'lib/plates/review.ts': [
    review,
    {
      lockEditablePlate: 'write: the guard every review change takes',
      setWellExclusion: 'write: exclusions',
      setFitModel: 'write: the fit model of a compound × target',
    },
  ],
  'lib/plates/recompute.ts': [
    recompute,
    {
      queueRefit: 'write: queues a refit job (plate data are written by refitPlate)',
      requestRefit: 'write: marks fits pending and queues a refit',
      recomputePlate: 'write: QC, block and version after a change',
      refitPlate: 'write: the fits',
      runPlateFitsJob: 'write: the fit job',
      requeueLostRefits: 'sweep: queues refits only for plates whose fits are pending, never an approved one',
    },
  ],
  'lib/plates/store.ts': [
    store,
    {
      sha256Hex: 'pure: a hash',
      findDuplicateUpload: 'read',
      storeUploadedFile:
        'writes the file record the plates of one file share, before any plate; no plate data',
      storePlate: 'write: re-import (a new plate; the same file again is refused)',
    },
  ],
  'lib/plates/import-service.ts': [
    importService,
    {
      readOnce: 'read: parses an upload',
      inspectUpload: 'writes an import draft only',
      previewImport: 'read',
      checkImport: 'read: checks each plate of a file',
      commitImport: 'write: re-import (a new plate; the same file again is refused)',
      inspectSheets: 'pure',
    },
  ],
  'lib/compounds/service.ts': [
    compoundService,
    {
      insertCompound: 'writes a new compound, on no plate yet',
      createCompound: 'writes a new compound, on no plate yet',
      updateCompound: 'write: a rename shows on every plate the compound is on',
      insertBatch: 'writes a batch; plates do not name batches',
      addBatch: 'writes a batch; plates do not name batches',
      getCompound: 'read',
    },
  ],
  'lib/screens/service.ts': [
    screenService,
    {
      createScreen: 'writes a new screen, with no plates',
      updateScreen: 'write: the QC settings and exposures plates are analysed with',
      addTarget: 'writes a target of the screen; an imported plate keeps its targets',
      setTargetMapping:
        'writes a target’s conductance in a preset the screen does not use; fits and forecasts read the current one',
    },
  ],
  'lib/signoff/service.ts': [signoff, { signPlateStep: 'write: a sign-off step' }],
  'lib/forecasts/plate-run.ts': [
    plateRun,
    {
      startPlateForecasts: 'writes forecasts (derived, keyed by their input), never plate data',
      runPlateForecasts: 'writes forecasts (derived, keyed by their input), never plate data',
    },
  ],
};

/** Every changing route handler and server action, with the services above it reaches. */
const CHANGING_ENTRY_POINTS: Record<string, string> = {
  'app/api/plates/[plateId]/exclusions/route.ts POST': 'setWellExclusion',
  'app/api/plates/[plateId]/fit-model/route.ts POST': 'setFitModel',
  'app/api/plates/[plateId]/jobs/route.ts POST': 'startPlateForecasts',
  'app/api/imports/plate/route.ts POST': 'commitImport (a new plate)',
  'app/api/imports/commit/route.ts POST': 'commitImport (a new plate)',
  'app/api/imports/inspect/route.ts POST': 'inspectUpload (a draft)',
  'app/api/imports/preview/route.ts POST': 'previewImport (reads)',
  'app/api/imports/unknown-compounds/route.ts POST': 'new compounds and aliases, then commitImport',
  'app/api/imports/wait/route.ts POST': 'a waiting draft, no plate',
  'app/api/imports/discard/route.ts POST': 'removes a draft, no plate',
  'app/api/import-templates/route.ts POST': 'an import template, no plate',
  'app/api/import-templates/[templateId]/route.ts DELETE': 'an import template, no plate',
  'app/api/compounds/bulk/route.ts POST': 'new compounds, on no plate yet',
  'app/api/grid-layouts/[grid]/route.ts PUT': 'own grid layout, no plate data',
  'app/api/grid-layouts/[grid]/route.ts DELETE': 'own grid layout, no plate data',
  'app/(app)/plates/[plateId]/signoff/actions.ts signPlateStepAction': 'signPlateStep',
  'app/(app)/compounds/actions.ts createCompoundAction': 'createCompound',
  'app/(app)/compounds/actions.ts updateCompoundAction': 'updateCompound',
  'app/(app)/compounds/actions.ts addBatchAction': 'addBatch',
  'app/(app)/screens/actions.ts createScreenAction': 'createScreen',
  'app/(app)/screens/actions.ts updateScreenAction': 'updateScreen',
  'app/(app)/screens/actions.ts addTargetAction': 'addTarget',
  'app/(app)/screens/actions.ts setTargetMappingAction': 'setTargetMapping',
  'app/(app)/admin/users/actions.ts': 'users, no plate data',
  'app/(app)/admin/outbox/actions.ts': 'mail, no plate data',
  'app/(app)/account/actions.ts': 'own account, no plate data',
  'app/(app)/notices/actions.ts': 'own notices marked seen, no plate data',
  'app/(auth)/lost-password/actions.ts': 'password links, no plate data',
  'app/(auth)/password-link/[token]/actions.ts': 'own password, no plate data',
  'app/(auth)/sign-in/actions.ts': 'sessions, no plate data',
};

function filesUnder(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    return entry.isDirectory() ? filesUnder(full) : [full];
  });
}

describe('the list of write paths is complete', () => {
  test.each(Object.entries(MODULE_EXPORTS))(
    '%s: every exported function is listed',
    (_file, [module, listed]) => {
      const functions = Object.entries(module)
        .filter(([, value]) => typeof value === 'function')
        .map(([name]) => name)
        .sort();
      expect(functions).toEqual(Object.keys(listed).sort());
    },
  );

  test('every changing route handler and server action is listed', () => {
    const found: string[] = [];
    for (const file of filesUnder('app')) {
      const relative = path.relative(process.cwd(), file).split(path.sep).join('/');
      const source = readFileSync(file, 'utf8');
      if (file.endsWith('route.ts')) {
        for (const [, method] of source.matchAll(/export const (POST|PUT|PATCH|DELETE)\b/g))
          found.push(`${relative} ${method}`);
      } else if (/^'use server'/m.test(source)) {
        const actions = [...source.matchAll(/export const (\w+Action)\b/g)].map(([, name]) => name);
        const perAction = Object.keys(CHANGING_ENTRY_POINTS).some((key) => key.startsWith(`${relative} `));
        if (perAction) found.push(...actions.map((name) => `${relative} ${name}`));
        else found.push(relative);
      }
    }
    expect(found.sort()).toEqual(Object.keys(CHANGING_ENTRY_POINTS).sort());
  });
});

describe('an approved plate refuses every write path, with nothing written', () => {
  let cast: SignoffCast;
  let plateId: string;
  let screens: Record<string, string>;

  /** Everything of the plate that a write could touch, as stored. */
  async function snapshot() {
    const [row] = await db().query<Record<string, unknown>>(
      `select (select to_jsonb(p) from plates p where p.id = :plateId) as plate,
              (select jsonb_agg(to_jsonb(w) order by w.id) from wells w where w.plate_id = :plateId) as wells,
              (select jsonb_agg(to_jsonb(r) order by r.id) from readouts r join wells w on w.id = r.well_id
                where w.plate_id = :plateId) as readouts,
              (select jsonb_agg(to_jsonb(f) order by f.id) from fits f where f.plate_id = :plateId) as fits,
              (select count(*)::int from audit_events a where a.entity_id::text = :plateId) as "auditEvents",
              (select count(*)::int from signatures s where s.entity_id::text = :plateId) as signatures`,
      { type: QueryTypes.SELECT, replacements: { plateId } },
    );
    return { ...row, contentSha256: contentSha256(await plateContent(plateId)) };
  }

  beforeAll(async () => {
    await resetDatabase();
    cast = await signoffCast();
    plateId = cast.plateId;
    screens = { 'Nav1.7': (await Plate.findByPk(plateId, { rejectOnEmpty: true })).screenId };
    for (const [actor, action] of [
      [cast.chemist, 'verify'],
      [cast.biologist, 'submit'],
      [cast.approver, 'approve'],
    ] as const) {
      const { version } = await Plate.findByPk(plateId, { rejectOnEmpty: true });
      await signoff.signPlateStep(actor, plateId, { action, password: PASSWORD, expectedVersion: version });
    }
    expect((await Plate.findByPk(plateId, { rejectOnEmpty: true })).state).toBe('approved');
  });
  afterAll(() => db().close());

  /** Runs a write path on the approved plate, and checks that nothing of the plate changed. */
  async function unchangedAfter<T>(write: () => Promise<T>): Promise<T | unknown> {
    const before = await snapshot();
    const outcome = await write().then(
      (value) => value,
      (error: unknown) => error,
    );
    expect(await snapshot()).toEqual(before);
    return outcome;
  }

  const locked = {
    code: 'locked',
    message: 'Plate NAV-P01 is approved and locked; a correction is a new import that references it.',
  };
  /** The database's own refusal (fourth migration's trigger), for paths below the service guards. */
  const refusedByDatabase = /plate [0-9a-f-]{36} is approved and locked/;

  const wellOf = async () =>
    (await listPlateWells(cast.biologist, plateId)).find((w) => w.compoundId !== null && !w.excluded)!;

  test('lockEditablePlate', async () => {
    const outcome = await unchangedAfter(() =>
      db().transaction((transaction) => review.lockEditablePlate(plateId, undefined, transaction)),
    );
    expect(outcome).toMatchObject(locked);
  });

  test('setWellExclusion', async () => {
    const well = await wellOf();
    const outcome = await unchangedAfter(() =>
      review.setWellExclusion(cast.biologist, plateId, {
        wellIds: [well.id],
        excluded: true,
        reason: 'bubble seen after approval',
      }),
    );
    expect(outcome).toMatchObject(locked);
  });

  test('setFitModel', async () => {
    const fit = (await listPlateFits(cast.biologist, plateId))[0]!;
    const outcome = await unchangedAfter(() =>
      review.setFitModel(cast.biologist, plateId, {
        compoundId: fit.compoundId,
        targetId: fit.targetId,
        model: fit.model === 'hill2' ? 'hill4' : 'hill2',
      }),
    );
    expect(outcome).toMatchObject(locked);
  });

  test('recomputePlate', async () => {
    const outcome = await unchangedAfter(() =>
      db().transaction(async (transaction) => {
        const plate = await Plate.findByPk(plateId, { transaction, rejectOnEmpty: true });
        await recompute.recomputePlate(plate, cast.biologist.id, transaction);
      }),
    );
    expect(String(outcome)).toMatch(refusedByDatabase);
  });

  test('requestRefit', async () => {
    const outcome = await unchangedAfter(() =>
      db().transaction(async (transaction) => {
        const plate = await Plate.findByPk(plateId, { transaction, rejectOnEmpty: true });
        await recompute.requestRefit(plate, cast.biologist.id, transaction);
      }),
    );
    expect(String(outcome)).toMatch(refusedByDatabase);
  });

  test('queueRefit', async () => {
    // A refit queued for an approved plate finds its fits current and writes nothing (refitPlate below).
    const outcome = await unchangedAfter(async () => {
      await db().transaction((transaction) => recompute.queueRefit(plateId, cast.biologist.id, transaction));
      return recompute.runPlateFitsJob({ plateId, requestedBy: cast.biologist.id });
    });
    expect(outcome).toBe('Nothing to do: its fits were already current.');
  });

  test('refitPlate', async () => {
    const outcome = await unchangedAfter(() =>
      db().transaction((transaction) => recompute.refitPlate(plateId, null, transaction)),
    );
    expect(outcome).toEqual({ refitted: false, reason: 'its fits were already current' });
  });

  test('runPlateFitsJob', async () => {
    const outcome = await unchangedAfter(() =>
      recompute.runPlateFitsJob({ plateId, requestedBy: cast.biologist.id }),
    );
    expect(outcome).toBe('Nothing to do: its fits were already current.');
  });

  test('commitImport and storePlate: the same file again is refused, the approved plate untouched', async () => {
    const request = await demoCommitRequest(cast.biologist, screens, 'nav-96-plate-01.xlsx', {
      label: 'NAV-P01-AGAIN',
    });
    const outcome = await unchangedAfter(() => importService.commitImport(cast.biologist, request));
    expect(outcome).toMatchObject({
      code: 'conflict',
      message: 'This exact file was already imported for this screen as plate NAV-P01.',
    });
  });

  test('updateScreen: new QC settings and exposures leave the approved plate as it was', async () => {
    const outcome = await unchangedAfter(() =>
      screenService.updateScreen(
        cast.admin,
        screens['Nav1.7']!,
        screenSchema.parse({
          name: 'Pain sodium screen',
          description: 'tightened after approval',
          neuronPreset: 'pospischil-rs-2008',
          zPrimeMin: 0.9,
          sealResistanceMin_GOhm: 5,
          controlCurrentMin_pA: 5000,
          seriesResistanceMax_MOhm: 2,
          capacitanceMin_pF: 1,
          capacitanceMax_pF: 100,
          vehicleRundownMax_percent: 1,
          exposures_uM: '0.3, 3',
        }),
      ),
    );
    expect(outcome).toBeUndefined();
  });

  test('signPlateStep: no step leads out of approved', async () => {
    for (const action of ['verify', 'submit', 'approve', 'reject', 'rework'] as const) {
      const actor =
        action === 'verify'
          ? cast.chemist
          : action === 'approve' || action === 'reject'
            ? cast.approver2
            : cast.biologist;
      const outcome = await unchangedAfter(() =>
        signoff.signPlateStep(actor, plateId, { action, password: PASSWORD, comment: 'after approval' }),
      );
      expect(outcome, action).toMatchObject({ code: 'locked' });
      expect(String((outcome as Error).message), action).toMatch(
        /^Plate NAV-P01 was approved by Test approver \(.+ UTC\) and is locked: no signature, edit or exclusion can change it\. A correction is a new import that references it\. Nothing was signed\.$/,
      );
    }
  });

  test('startPlateForecasts and runPlateForecasts write forecasts only', async () => {
    const outcome = await unchangedAfter(() => plateRun.startPlateForecasts(cast.chemist, plateId, null));
    expect(outcome).toMatchObject({ created: true });
  });

  // The approved plate's signed content names its compounds by identifier: the identifier of a compound it
  // uses is refused a change, in the service (pointing to aliases) and in the database, with nothing changed.
  test('updateCompound: renaming a compound on the approved plate is refused, pointing to aliases', async () => {
    const well = await wellOf();
    const compound = await compoundService.getCompound(cast.chemist, well.compoundId!);
    const compoundRow = () =>
      db().query('select to_jsonb(c) as c from compounds c where c.id = :id', {
        type: QueryTypes.SELECT,
        replacements: { id: compound.id },
      });
    const compoundEvents = () =>
      db().query('select count(*)::int as n from audit_events where entity_id::text = :id', {
        type: QueryTypes.SELECT,
        replacements: { id: compound.id },
      });
    const [rowBefore, eventsBefore] = [await compoundRow(), await compoundEvents()];
    const outcome = await unchangedAfter(() =>
      compoundService.updateCompound(cast.chemist, well.compoundId!, {
        identifier: `${compound.identifier}-R`,
        name: compound.name,
        smiles: compound.smiles ?? '',
        molecularWeight: compound.molecularWeight,
      }),
    );
    expect(outcome).toMatchObject({
      code: 'locked',
      message: `${compound.identifier} is used on approved plate NAV-P01, whose signed content names it, so its identifier cannot change; nothing was changed. Keep ${compound.identifier} and use the new name as an alias of it: an import whose file uses the new name offers to map it to ${compound.identifier}.`,
    });
    expect(await compoundRow()).toEqual(rowBefore);
    expect(await compoundEvents()).toEqual(eventsBefore);

    // Past the service, the database refuses it too (migration 20261210001900).
    const direct = await unchangedAfter(() =>
      db().query("update compounds set identifier = identifier || '-R' where id = :id", {
        replacements: { id: compound.id },
      }),
    );
    expect(String(direct)).toMatch(
      new RegExp(
        `compound ${compound.identifier} is used on approved plate NAV-P01; its identifier cannot change`,
      ),
    );
    expect(await compoundRow()).toEqual(rowBefore);
  });

  test.each([
    ['plates', `update plates set label = label || '-x' where id = :plateId`],
    ['wells', `update wells set excluded = true where plate_id = :plateId`],
    [
      'readouts',
      `update readouts set qc_reasons = '[]' where well_id in (select id from wells where plate_id = :plateId)`,
    ],
    ['fits', `delete from fits where plate_id = :plateId`],
  ])('the database itself refuses a change to the %s of the approved plate', async (_table, sql) => {
    const outcome = await unchangedAfter(() => db().query(sql, { replacements: { plateId } }));
    expect(String(outcome)).toMatch(refusedByDatabase);
  });
});
