import 'server-only';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import { readRegistrationSheet, type BulkRowResult } from './bulk-sheet';
import { selectRegisteredIdentifiers } from './queries';
import { insertBatch, insertCompound } from './service';

export interface BulkRegistration {
  rows: BulkRowResult[];
  problems: string[];
  ok: boolean;
  registered: number;
}

/**
 * Registers every compound of a spreadsheet (first sheet), each with its first batch when a lot is
 * given. All rows are checked first; with any error nothing is registered (commit false previews only).
 */
export async function registerCompoundsFromSheet(
  actor: Actor,
  file: { bytes: Uint8Array; filename: string },
  commit: boolean,
): Promise<BulkRegistration> {
  requireCapability(actor, 'registerCompounds');
  const parsed = await parseSpreadsheet(file.bytes, file.filename);
  if (!parsed.ok)
    throw new AppError(parsed.error.code === 'too_large' ? 'too_large' : 'invalid', parsed.error.message);
  const sheet = parsed.sheets[0];
  if (!sheet) throw new AppError('invalid', `${file.filename} holds no sheets.`);
  const { rows, problems } = readRegistrationSheet(sheet);
  const known = await selectRegisteredIdentifiers(
    rows
      .filter((r) => r.input)
      .map((r) => r.input!.identifier.toUpperCase())
      .concat(''),
  );
  const registered = new Set(known.map((k) => k.identifier.toUpperCase()));
  for (const row of rows) {
    if (row.input && registered.has(row.input.identifier.toUpperCase())) {
      row.errors.push(
        `Sheet "${sheet.name}", row ${row.row}: ${row.input.identifier} is already registered.`,
      );
      row.input = null;
    }
  }
  const ok = problems.length === 0 && rows.every((r) => r.errors.length === 0);
  if (!commit || !ok) return { rows, problems, ok, registered: 0 };
  await db().transaction(async (transaction) => {
    for (const row of rows) {
      const { lot, purity_percent, stockConcentration_mM, solvent, ...compound } = row.input!;
      const created = await insertCompound(actor, compound, transaction);
      if (lot)
        await insertBatch(
          actor,
          created.id,
          { lot, purity_percent, stockConcentration_mM, solvent: solvent || 'DMSO' },
          transaction,
        );
    }
  });
  return { rows, problems, ok, registered: rows.length };
}
