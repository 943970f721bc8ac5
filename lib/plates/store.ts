import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import type { Actor } from '@/lib/auth/roles';
import { resolveCompoundNames } from '@/lib/compounds/aliases';
import { AppError } from '@/lib/errors';
import type { ParsedPlate } from '@/lib/imports/build-plate';
import { PRIMARY_READOUT } from '@/lib/domain/fits';
import { analysePlate } from '@/lib/science/plate-analysis';
import { Plate, Screen, Target, UploadedFile } from '@/models';
import { analysisInput, type ReadoutData } from './analysis-input';
import { insertReadouts, insertWells, selectDuplicateUpload } from './queries';
import { queueRefit } from './recompute';
import { analysisSettings } from './settings';

export interface StorePlateInput {
  screenId: string;
  label: string;
  file: { bytes: Uint8Array; filename: string; mediaType: string };
  plate: ParsedPlate;
  importTemplateId?: string | null;
  supersedesPlateId?: string | null;
  /** Plate facts read from outside the file's table (barcode, run date, cell line, temperature, operator). */
  facts?: Record<string, string>;
  /** The file's record when another plate of the same file stored it already (storeUploadedFile). */
  uploadedFile?: StoredFile;
}

/** An uploaded file as stored: its record's id and its SHA-256. */
export interface StoredFile {
  id: string;
  sha256: string;
}

export const sha256Hex = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');

/** The plate already made from these exact bytes for this screen, if any. */
export async function findDuplicateUpload(
  screenId: string,
  sha256: string,
  transaction?: Transaction,
): Promise<{ plateId: string; label: string } | null> {
  const row = await selectDuplicateUpload(screenId, sha256, transaction);
  return row ?? null;
}

async function idsByName(screenId: string, plate: ParsedPlate, transaction: Transaction) {
  const targets = await Target.findAll({ where: { screenId }, transaction });
  const targetId = new Map(targets.map((t) => [t.name.toLowerCase(), t.id]));
  const wanted = [
    ...new Set(
      plate.wells
        .filter((w) => w.role === 'test')
        .map((w) => w.compound)
        .filter((c): c is string => c !== null),
    ),
  ];
  // Identifiers and aliases alike (lib/compounds/aliases.ts), keyed by the file's name upper-cased.
  const compounds = await resolveCompoundNames(wanted, transaction);
  const compoundId = new Map([...compounds].map(([name, c]) => [name, c.id]));
  const missingTarget = plate.targets.find((t) => !targetId.has(t.toLowerCase()));
  if (missingTarget)
    throw new AppError('invalid', `Target "${missingTarget}" is not a target of this screen.`);
  const missingCompound = wanted.find((c) => !compoundId.has(c.toUpperCase()));
  if (missingCompound) throw new AppError('invalid', `Compound "${missingCompound}" is not registered.`);
  // A use-dependent readout needs a target whose screen names one (Screens page, block readouts).
  const twoReadouts = new Set(
    targets.filter((t) => t.blockReadouts?.use_dependent).map((t) => t.name.toLowerCase()),
  );
  const oneReadout = plate.wells
    .flatMap((w) => w.readouts)
    .find((r) => r.readout === 'use_dependent' && !twoReadouts.has(r.target.toLowerCase()));
  if (oneReadout)
    throw new AppError(
      'invalid',
      `Target "${oneReadout.target}" reports one block readout on this screen, but the file maps a use-dependent one; an administrator names the target's use-dependent readout on the screen's page first.`,
    );
  return {
    target: (name: string) => targetId.get(name.toLowerCase())!,
    compound: (id: string | null) => (id === null ? null : compoundId.get(id.toUpperCase())!),
  };
}

/**
 * Stores the raw file with its SHA-256 in the caller's transaction, once per file whatever number of
 * plates it holds; a file already stored for the screen is refused (its first plate named).
 */
export async function storeUploadedFile(
  actor: Actor,
  screenId: string,
  file: StorePlateInput['file'],
  transaction: Transaction,
): Promise<StoredFile> {
  const sha256 = sha256Hex(file.bytes);
  const duplicate = await findDuplicateUpload(screenId, sha256, transaction);
  if (duplicate) {
    throw new AppError(
      'conflict',
      `This exact file was already imported for this screen as plate ${duplicate.label}.`,
      { plateId: duplicate.plateId },
    );
  }
  const stored = await UploadedFile.create(
    {
      screenId,
      filename: file.filename,
      mediaType: file.mediaType,
      sizeBytes: file.bytes.byteLength,
      sha256,
      content: Buffer.from(file.bytes),
      uploadedBy: actor.id,
    },
    { transaction },
  );
  return { id: stored.id, sha256 };
}

/**
 * Writes an imported plate in the caller's transaction: the raw file with its SHA-256 (unless a plate of
 * the same file stored it, `uploadedFile`), the plate, its wells and readouts with QC reasons and block,
 * Z′ per target, the queued fit job, and the audit event.
 */
export async function storePlate(
  actor: Actor,
  input: StorePlateInput,
  transaction: Transaction,
): Promise<{ plateId: string }> {
  const screen = await Screen.findByPk(input.screenId, { transaction });
  if (!screen) throw new AppError('not_found', 'No such screen.');
  const file = input.uploadedFile ?? (await storeUploadedFile(actor, screen.id, input.file, transaction));
  const { sha256 } = file;
  const ids = await idsByName(screen.id, input.plate, transaction);
  const plateId = randomUUID();
  const readouts: ReadoutData[] = [];
  const wellRows = input.plate.wells.map((w) => {
    const id = randomUUID();
    const compoundId = w.role === 'test' ? ids.compound(w.compound) : null;
    for (const r of w.readouts) {
      readouts.push({
        id: randomUUID(),
        wellId: id,
        targetId: ids.target(r.target),
        controlCurrent_pA: r.controlCurrent_pA,
        compoundCurrent_pA: r.compoundCurrent_pA,
        ...(r.givenBlock !== undefined ? { blockGiven: true, givenBlock: r.givenBlock } : {}),
        ...(r.concentration_uM !== undefined ? { concentration_uM: r.concentration_uM } : {}),
        ...(r.readout !== undefined ? { readout: r.readout } : {}),
      });
    }
    return {
      id,
      plateId,
      position: w.position,
      rowIndex: w.rowIndex,
      columnIndex: w.columnIndex,
      role: w.role,
      compoundId,
      batchId: null,
      concentration_uM: w.concentration_uM,
      sealResistance_GOhm: w.sealResistance_GOhm,
      seriesResistance_MOhm: w.seriesResistance_MOhm,
      capacitance_pF: w.capacitance_pF,
      exclusionReason: null,
      excludedBy: null,
      excludedAt: null,
    };
  });
  // QC, block and Z′ are stored with the plate; the fits come from the job queued below.
  const science = analysisInput(wellRows, readouts);
  const analysis = analysePlate(science.wells, science.readouts, analysisSettings(screen), { fits: false });

  await Plate.create(
    {
      id: plateId,
      screenId: screen.id,
      uploadedFileId: file.id,
      importTemplateId: input.importTemplateId ?? null,
      supersedesPlateId: input.supersedesPlateId ?? null,
      label: input.label,
      facts: input.facts ?? {},
      format: input.plate.format,
      importedBy: actor.id,
      verifiedBy: null,
      submittedBy: null,
      decidedBy: null,
      qcSummary: analysis.targets,
      fitsPending: true,
      fitsRequestedAt: new Date(),
      fittedAt: null,
    },
    { transaction },
  );
  // Wells and readouts go in as one JSON parameter each: a 384-well plate is hundreds of rows, and
  // building model instances and escaped SQL for each took most of an import's time on the server.
  await insertWells(
    wellRows.map((w) => ({
      id: w.id,
      plate_id: plateId,
      position: w.position,
      row_index: w.rowIndex,
      column_index: w.columnIndex,
      role: w.role,
      compound_id: w.compoundId,
      concentration_um: w.concentration_uM,
      seal_resistance_gohm: w.sealResistance_GOhm,
      series_resistance_mohm: w.seriesResistance_MOhm,
      capacitance_pf: w.capacitance_pF,
    })),
    transaction,
  );
  await insertReadouts(
    readouts.map((r, i) => ({
      id: r.id,
      well_id: r.wellId,
      target_id: r.targetId,
      control_current_pa: r.controlCurrent_pA,
      compound_current_pa: r.compoundCurrent_pA,
      block_given: r.blockGiven ?? false,
      given_block: r.givenBlock ?? null,
      concentration_um: r.concentration_uM ?? null,
      fractional_block: analysis.readouts[i]!.block,
      qc_reasons: analysis.readouts[i]!.qcReasons,
      readout: r.readout ?? PRIMARY_READOUT,
    })),
    transaction,
  );
  const fitJob = await queueRefit(plateId, actor.id, transaction);
  await recordAudit(
    {
      actorId: actor.id,
      action: 'import',
      entityType: 'plate',
      entityId: plateId,
      address: actor.address,
      after: {
        label: input.label,
        screenId: screen.id,
        format: input.plate.format,
        filename: input.file.filename,
        sha256,
        wells: wellRows.length,
        readouts: readouts.length,
        fitJobId: fitJob.id,
        supersedesPlateId: input.supersedesPlateId ?? null,
      },
    },
    transaction,
  );
  return { plateId };
}
