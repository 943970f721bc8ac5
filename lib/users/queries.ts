import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';

// SQL for a lock: a transaction-level advisory lock that serialises every change to who is an enabled admin.
export async function lockAdminSetKey(transaction: Transaction): Promise<void> {
  await db().query(`select pg_advisory_xact_lock(hashtext('gatewell.admin-set'))`, { transaction });
}

// SQL: an aggregate over users joined to their roles, in the caller's transaction (after the admin-set lock).
export async function countOtherEnabledAdmins(
  userId: string,
  transaction: Transaction,
): Promise<number | undefined> {
  const [row] = await db().query<{ n: number }>(
    `select count(*)::int as n from users u join user_roles r on r.user_id = u.id
      where r.role = 'admin' and u.disabled_at is null and u.id <> :userId`,
    { replacements: { userId }, transaction, type: QueryTypes.SELECT },
  );
  return row?.n;
}
