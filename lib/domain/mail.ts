// What Gatewell mails and where each message stands in the outbox (table mail_outbox).

export const MAIL_KINDS = [
  'plate_imported',
  'plate_verified',
  'plate_submitted',
  'plate_approved',
  'plate_rejected',
  'plate_reopened',
  'password_link',
  'account_invitation',
  /** An import waits for compounds the registry lacks: to everyone who may register them. */
  'import_waiting_for_compounds',
  /** Every compound a waiting import lacked is now registered: to the import's owner. */
  'import_compounds_ready',
] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
/** Kinds whose message carries a password link: cut from the outbox's copy once sent, never sent again. */
export const LINK_MAIL_KINDS: readonly MailKind[] = ['password_link', 'account_invitation'];
export const MAIL_STATES = ['queued', 'sent', 'failed'] as const;
export type MailState = (typeof MAIL_STATES)[number];
