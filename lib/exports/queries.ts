import 'server-only';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import type { PlateState } from '@/lib/domain/plate-states';

/** One signed transition of a plate, as the export reads it. */
export interface PlateSignoffRow {
  plateId: string;
  plateLabel: string;
  fromState: PlateState;
  toState: PlateState;
  signer: string;
  signerEmail: string;
  meaning: string;
  comment: string;
  signedAt: string;
  contentSha256: string;
}

// SQL for speed: the sign-offs of many plates with signature, signer and plate in one query, times as UTC text.
export async function selectPlateSignoffs(plateIds: string[]): Promise<PlateSignoffRow[]> {
  return db().query<PlateSignoffRow>(
    `select e.plate_id as "plateId", p.label as "plateLabel", e.from_state as "fromState", e.to_state as "toState", u.name as signer, u.email as "signerEmail",
            s.meaning, s.comment, to_char(s.signed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "signedAt", s.content_sha256 as "contentSha256"
       from signoff_events e join signatures s on s.id = e.signature_id join users u on u.id = s.signer_id join plates p on p.id = e.plate_id
      where e.plate_id in (:plateIds)
      order by p.label, e.occurred_at, e.id`,
    { type: QueryTypes.SELECT, replacements: { plateIds } },
  );
}
