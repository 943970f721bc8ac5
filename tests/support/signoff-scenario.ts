import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { makeActor } from './actors';
import { importDemoPlate } from './demo-plates';
import { makeDemoScreens } from './demo-scenario';

export const PASSWORD = 'test-password-123';

export interface SignoffCast {
  admin: Actor;
  chemist: Actor;
  biologist: Actor;
  approver: Actor;
  approver2: Actor;
  plateId: string;
}

/** Real users of each role and one demo plate imported by the biologist, as the sign-off tests start. */
export async function signoffCast(file = 'nav-96-plate-01.xlsx'): Promise<SignoffCast> {
  const admin = await makeActor(['admin']);
  const chemist = await makeActor(['chemist']);
  const screens = await makeDemoScreens(admin, chemist);
  const biologist = await makeActor(['biologist']);
  const approver = await makeActor(['approver']);
  const approver2 = await makeActor(['approver']);
  const plateId = await importDemoPlate(biologist, screens, file);
  return { admin, chemist, biologist, approver, approver2, plateId };
}

/** Rows that a signature writes, and the plate's version: none may change when a signature is refused. */
export async function writtenRows(plateId: string) {
  const [row] = await db().query<Record<string, number>>(
    `select (select count(*)::int from signatures) as signatures,
            (select count(*)::int from signoff_events) as events,
            (select count(*)::int from audit_events) as audits,
            (select count(*)::int from mail_outbox) as mail,
            (select version from plates where id = :plateId) as version`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return row!;
}
