import 'server-only';
import { PLATE_STATE_LABEL } from '@/lib/domain/plate-states';
import type { Cell, ExportTable } from './document';
import { selectPlateSignoffs, type PlateSignoffRow as PlateSignoff } from './queries';

/** Every signed transition of these plates, oldest first, with who signed, meaning and comment. */
export async function listPlateSignoffs(plateIds: string[]): Promise<PlateSignoff[]> {
  if (plateIds.length === 0) return [];
  return selectPlateSignoffs(plateIds);
}

/** One about line per signature, e.g. "Map verified → Awaiting approval: signed by …". */
export function signoffLines(signoffs: PlateSignoff[], withPlate: boolean): [string, Cell][] {
  if (signoffs.length === 0) return [['Signatures', 'None yet: the plate has not been signed in sign-off.']];
  return signoffs.map((s, i) => [
    `Signature ${i + 1}`,
    `${withPlate ? `${s.plateLabel}: ` : ''}${PLATE_STATE_LABEL[s.fromState]} → ${PLATE_STATE_LABEL[s.toState]}, signed by ${s.signer} <${s.signerEmail}> at ${s.signedAt} meaning “${s.meaning}”${s.comment ? `, comment “${s.comment}”` : ''}`,
  ]);
}

/** The sign-off sheet: one row per signature. */
export function signoffTable(signoffs: PlateSignoff[]): ExportTable {
  return {
    sheet: 'Sign-off',
    key: 'signoff',
    columns: [
      'Plate',
      'From state',
      'To state',
      'Signed by',
      'E-mail',
      'Meaning',
      'Comment',
      'Signed at (UTC)',
      'Signed content SHA-256',
    ],
    rows: signoffs.map((s) => [
      s.plateLabel,
      PLATE_STATE_LABEL[s.fromState],
      PLATE_STATE_LABEL[s.toState],
      s.signer,
      s.signerEmail,
      s.meaning,
      s.comment,
      s.signedAt,
      s.contentSha256,
    ]),
  };
}
