import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import type { Role } from '@/lib/domain/roles';

export interface ActorRow {
  id: string;
  email: string;
  name: string;
  sessionVersion: number;
  passwordChangeRequired: boolean;
  roles: Role[];
}

// SQL for speed: every signed-in request asks this; one query, roles aggregated and sorted by PostgreSQL, no instances.
export async function selectEnabledActor(userId: string): Promise<ActorRow | undefined> {
  const [user] = await db().query<ActorRow>(
    `select u.id, u.email, u.name, u.session_version as "sessionVersion", u.password_change_required as "passwordChangeRequired",
            coalesce(array_agg(r.role::text order by r.role::text) filter (where r.role is not null), '{}') as roles
       from users u left join user_roles r on r.user_id = u.id
      where u.id = :userId and u.disabled_at is null
      group by u.id`,
    { type: QueryTypes.SELECT, replacements: { userId } },
  );
  return user;
}

// SQL for speed: both throttling counts of a lost-password request in one round trip.
export async function countRecentLinkRequests(
  address: string,
  email: string,
  since: Date,
): Promise<{ byAddress: number; linksToEmail: number }> {
  const [counts] = await db().query<{ byAddress: number; linksToEmail: number }>(
    `select (select count(*) from password_links where address = :address and requested_at >= :since)::int as "byAddress",
            (select count(*) from password_links where email = :email and token_sha256 is not null and requested_at >= :since)::int as "linksToEmail"`,
    { type: QueryTypes.SELECT, replacements: { address, email, since } },
  );
  return counts!;
}

// SQL: each link's new expiry is worked out from its own columns and the database's clock, which the ORM cannot say.
export async function expireUnusedLinks(userId: string, transaction: Transaction): Promise<void> {
  await db().query(
    `update password_links set expires_at = greatest(requested_at + interval '1 millisecond', least(expires_at, now()))
      where user_id = :userId and used_at is null and expires_at > now()`,
    { replacements: { userId }, transaction },
  );
}

export interface NewLink {
  id: string;
  email: string;
  userId: string;
  tokenSha256: Buffer;
  lifetimeMs: number;
  address: string;
  passwordChangedAt: Date;
}

// SQL: the link's time comes from the database's clock, never before the account's password time; the ORM cannot say this insert.
export async function insertLinkWithToken(
  link: NewLink,
  transaction: Transaction,
): Promise<{ requestedAt: Date }> {
  const [row] = await db().query<{ requestedAt: Date }>(
    `with made as (select greatest(clock_timestamp(), :passwordChangedAt::timestamptz) as at)
     insert into password_links (id, email, user_id, token_sha256, requested_at, expires_at, address)
       select :id, :email, :userId, :tokenSha256, made.at, made.at + :lifetimeMs * interval '1 millisecond', :address from made
     returning requested_at as "requestedAt"`,
    { type: QueryTypes.SELECT, replacements: { ...link }, transaction },
  );
  return row!;
}
