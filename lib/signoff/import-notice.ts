import 'server-only';
import type { Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { queueMail } from '@/lib/mail/outbox';
import { Plate, Screen } from '@/models';
import { noticesFor } from './notices';
import { plateQcWarnings } from './qc-warnings';
import { SIGNOFF_STEPS } from './steps';

/** Queues, in the import's transaction, the notice to chemists that a new plate waits for verification. */
export async function queueImportNotices(
  actor: Actor,
  plateId: string,
  transaction: Transaction,
): Promise<number> {
  const plate = await Plate.findByPk(plateId, { transaction, rejectOnEmpty: true });
  const screen = await Screen.findByPk(plate.screenId, { transaction, rejectOnEmpty: true });
  const notices = await noticesFor(
    'import',
    {
      actor,
      comment: '',
      qcWarnings: await plateQcWarnings(plate.id, transaction),
      signoffEventId: null,
      mayAct: (userId) => SIGNOFF_STEPS.verify.dutyConflict(plate, userId) === null,
      plate: {
        id: plate.id,
        label: plate.label,
        screenName: screen.name,
        importedBy: plate.importedBy,
        submittedBy: null,
      },
    },
    transaction,
  );
  return queueMail(notices, transaction);
}
