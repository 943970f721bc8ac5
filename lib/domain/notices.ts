// Notices in Gatewell (table notices): what a person is told about plates and waiting imports, and how
// each person chooses to be told (table notice_delivery). Pure: pages, services and models share it.

import type { MailKind } from './mail';

/** The mail kinds that are also notices in Gatewell: every message about a plate or a waiting import. */
export const NOTICE_KINDS = [
  'plate_imported',
  'plate_verified',
  'plate_submitted',
  'plate_approved',
  'plate_rejected',
  'plate_reopened',
  'import_waiting_for_compounds',
  'import_compounds_ready',
] as const satisfies readonly MailKind[];
export type NoticeKind = (typeof NOTICE_KINDS)[number];

export const isNoticeKind = (kind: MailKind): kind is NoticeKind =>
  (NOTICE_KINDS as readonly string[]).includes(kind);

/** How a person is told: by e-mail and in Gatewell (the default), or in Gatewell only. */
export const NOTICE_DELIVERIES = ['mail_and_app', 'app_only'] as const;
export type NoticeDelivery = (typeof NOTICE_DELIVERIES)[number];
export const DEFAULT_NOTICE_DELIVERY: NoticeDelivery = 'mail_and_app';

export const NOTICE_DELIVERY_LABELS: Record<NoticeDelivery, string> = {
  mail_and_app: 'By e-mail and in Gatewell',
  app_only: 'In Gatewell only',
};

/** A notice's state in words: new until its reader opens it or marks it seen. */
export const NOTICE_STATE_LABELS = { unseen: 'New', seen: 'Seen' } as const;

/** Notices a page of the Notices page shows. */
export const NOTICES_PER_PAGE = 25;

/** What a notice's link opens, in words, by kind. */
export const NOTICE_LINK_LABELS: Record<NoticeKind, string> = {
  plate_imported: 'Open the plate',
  plate_verified: 'Open the plate',
  plate_submitted: 'Open the plate',
  plate_approved: 'Open the plate',
  plate_rejected: 'Open the plate',
  plate_reopened: 'Open the plate',
  import_waiting_for_compounds: 'Open the waiting import',
  import_compounds_ready: 'Resume the import',
};

/** One notice as the Notices page shows it; `id` is only for the page's forms, never shown. */
export interface NoticeItem {
  id: string;
  kind: NoticeKind;
  title: string;
  summary: string;
  linkPath: string;
  createdAt: string;
  seen: boolean;
}
