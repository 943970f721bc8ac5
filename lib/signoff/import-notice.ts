import 'server-only';
import type { Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { queueNotices } from '@/lib/notices/queue';
import { Plate, Screen } from '@/models';
import { noticesFor, plateSignoffPath } from './notices';
import { plateQcWarnings } from './qc-warnings';
import { SIGNOFF_STEPS } from './steps';

/**
 * Writes, in the import's transaction, the notice to chemists (in Gatewell and by e-mail) that new plates wait for verification: one
 * notice per person for the whole import, however many plates the file held (the first plate's link,
 * then every plate's label and link, and the QC warnings of each, named by plate).
 */
export async function queueImportNotices(
  actor: Actor,
  plateIds: readonly string[],
  transaction: Transaction,
): Promise<number> {
  const plates = await Promise.all(
    plateIds.map((id) => Plate.findByPk(id, { transaction, rejectOnEmpty: true })),
  );
  const plate = plates[0]!;
  const screen = await Screen.findByPk(plate.screenId, { transaction, rejectOnEmpty: true });
  const several = plates.length > 1;
  const qcWarnings = (
    await Promise.all(
      plates.map(async (p) =>
        (await plateQcWarnings(p.id, transaction)).map((w) =>
          several ? { ...w, message: `Plate ${p.label}: ${w.message}` } : w,
        ),
      ),
    )
  ).flat();
  const notices = await noticesFor(
    'import',
    {
      actor,
      comment: several
        ? `${plates.length} plates from one file: ${plates.map((p) => `${p.label} (${plateSignoffPath(p.id)})`).join(', ')}.`
        : '',
      qcWarnings,
      signoffEventId: null,
      // Everyone told may verify every plate: the importer is the one person kept off, the same for each.
      mayAct: (userId) => plates.every((p) => SIGNOFF_STEPS.verify.dutyConflict(p, userId) === null),
      plate: {
        id: plate.id,
        label: several ? plates.map((p) => p.label).join(', ') : plate.label,
        screenName: screen.name,
        importedBy: plate.importedBy,
        submittedBy: null,
      },
    },
    transaction,
  );
  return queueNotices(notices, transaction);
}
