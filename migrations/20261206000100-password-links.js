'use strict';
// Someone who lost their password asks for a link by e-mail (the sign-in page's "Lost your password?").
// Every request is kept, for throttling and the record, also for addresses that match no active account
// (no user, no token then). A new account's invitation is such a link too. A link's token is kept only as
// its SHA-256; the link works once, within its expiry, and only while the account's password is the one
// it had when the link was made. The mail outbox learns the two kinds of message that carry one.

const PLATE_KINDS = [
  'plate_imported',
  'plate_verified',
  'plate_submitted',
  'plate_approved',
  'plate_rejected',
  'plate_reopened',
];

function kindCheck(kinds) {
  return `alter table mail_outbox drop constraint mail_outbox_kind_known,
    add constraint mail_outbox_kind_known check (kind in (${kinds.map((k) => `'${k}'`).join(', ')}))`;
}

/** @type {import('sequelize-cli').Migration} */
module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        create table password_links (
          id uuid primary key,
          email text not null,
          user_id uuid references users (id) on delete restrict,
          token_sha256 bytea unique,
          requested_at timestamptz not null default now(),
          expires_at timestamptz,
          used_at timestamptz,
          address text,
          constraint password_links_token_for_user check ((user_id is null) = (token_sha256 is null) and (token_sha256 is null) = (expires_at is null)),
          constraint password_links_expiry check (expires_at > requested_at),
          constraint password_links_used_in_time check (used_at is null or (token_sha256 is not null and used_at <= expires_at))
        );
        create index password_links_email on password_links (email, requested_at desc);
        create index password_links_address on password_links (address, requested_at desc);
        create index password_links_user on password_links (user_id, requested_at desc) where user_id is not null;
        ${kindCheck([...PLATE_KINDS, 'password_link', 'account_invitation'])};
        `,
        { transaction },
      );
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.transaction(async (transaction) => {
      await queryInterface.sequelize.query(
        `
        delete from mail_outbox where kind in ('password_link', 'account_invitation');
        ${kindCheck(PLATE_KINDS)};
        drop table if exists password_links;
        `,
        { transaction },
      );
    });
  },
};
