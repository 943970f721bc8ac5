import 'server-only';
import { QueryTypes } from 'sequelize';
import { can, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { rolesFor } from '@/lib/domain/roles';
import { AppError } from '@/lib/errors';
import type { SignoffAction } from '@/lib/domain/plate-states';
import type { PlateState } from '@/lib/domain/plate-states';
import { plateContentSha256 } from './plate-content';
import { stepsFrom, WAITING_FOR } from './steps';

export interface SignoffChoice {
  action: SignoffAction;
  label: string;
  meaning: string;
  commentRequired: boolean;
}

/** What the sign-off panel shows one person about one plate. */
export interface SignoffPanelData {
  plateId: string;
  label: string;
  state: PlateState;
  version: number;
  waitingFor: string;
  signers: { importedBy: string; verifiedBy: string | null; submittedBy: string | null; decidedBy: string | null };
  /** SHA-256 of the plate's data now, and of the data under the latest signature. */
  currentSha256: string;
  lastSignature: { signerName: string; signedAt: string; meaning: string; contentSha256: string } | null;
  /** The steps this person may sign now. */
  choices: SignoffChoice[];
  /** Why this person cannot sign the step the plate waits for, when that is so. */
  notYours: string | null;
}

interface PlateRow {
  id: string;
  label: string;
  state: PlateState;
  version: number;
  importedById: string;
  verifiedById: string | null;
  submittedById: string | null;
  importedBy: string;
  verifiedBy: string | null;
  submittedBy: string | null;
  decidedBy: string | null;
}

/** The sign-off panel of a plate for this person: its state, who signed, the data hash, and what they may sign. */
export async function signoffPanel(actor: Actor, plateId: string): Promise<SignoffPanelData> {
  const sequelize = db();
  const [plate] = await sequelize.query<PlateRow>(
    `select p.id, p.label, p.state, p.version, p.imported_by as "importedById", p.verified_by as "verifiedById", p.submitted_by as "submittedById",
            i.name as "importedBy", v.name as "verifiedBy", s.name as "submittedBy", d.name as "decidedBy"
       from plates p join users i on i.id = p.imported_by left join users v on v.id = p.verified_by
       left join users s on s.id = p.submitted_by left join users d on d.id = p.decided_by
      where p.id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const [last] = await sequelize.query<NonNullable<SignoffPanelData['lastSignature']>>(
    `select u.name as "signerName", to_char(s.signed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "signedAt", s.meaning, s.content_sha256 as "contentSha256"
       from signatures s join users u on u.id = s.signer_id where s.entity_type = 'plate' and s.entity_id = :plateId order by s.signed_at desc limit 1`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  const signers = { importedBy: plate.importedById, verifiedBy: plate.verifiedById, submittedBy: plate.submittedById };
  const steps = stepsFrom(plate.state);
  const withRole = steps.filter((step) => can(actor, step.capability));
  const allowed = withRole.filter((step) => step.dutyConflict(signers, actor.id) === null);
  const notYours = steps.length === 0 || allowed.length ? null : withRole.length ? withRole[0]!.dutyConflict(signers, actor.id) : `This step needs the ${rolesFor(steps[0]!.capability).join(' or ')} role.`;
  return {
    plateId: plate.id, label: plate.label, state: plate.state, version: plate.version, waitingFor: WAITING_FOR[plate.state],
    signers: { importedBy: plate.importedBy, verifiedBy: plate.verifiedBy, submittedBy: plate.submittedBy, decidedBy: plate.decidedBy },
    currentSha256: await plateContentSha256(plate.id),
    lastSignature: last ?? null,
    choices: allowed.map(({ action, label, meaning, commentRequired }) => ({ action, label, meaning, commentRequired })),
    notYours,
  };
}
