import type { Metadata } from 'next';
import { AppLink } from '@/components/ui/app-link';
import { OutboxButton } from '@/components/mail/outbox-buttons';
import { OutboxTable } from '@/components/mail/outbox-table';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { requirePageRole } from '@/lib/auth/page-guard';
import { rolesFor } from '@/lib/domain/roles';
import { listOutbox, outboxCounts } from '@/lib/mail/admin';
import { MAIL_STATES, type MailState } from '@/lib/domain/mail';
import { requeueMailAction, sendWaitingMailAction } from './actions';

export const metadata: Metadata = { title: 'Mail outbox' };

const FILTERS: { state: MailState | undefined; label: string }[] = [
  { state: undefined, label: 'All' },
  { state: 'queued', label: 'Waiting' },
  { state: 'sent', label: 'Sent' },
  { state: 'failed', label: 'Gave up' },
];

export default async function OutboxPage({ searchParams }: { searchParams: Promise<{ state?: string }> }) {
  const actor = await requirePageRole(...rolesFor('manageMail'));
  const wanted = (await searchParams).state;
  const state = MAIL_STATES.find((s) => s === wanted);
  const [rows, counts] = await Promise.all([listOutbox(actor, { state }), outboxCounts(actor)]);
  return (
    <>
      <PageHeader
        title="Mail outbox"
        intro={`Notifications queued with each sign-off step and sent over SMTP, retried with growing waits. ${counts.queued} waiting, ${counts.sent} sent, ${counts.failed} gave up.`}
        actions={
          <OutboxButton action={sendWaitingMailAction} label="Send waiting mail now" busyLabel="Sending…" />
        }
      />
      <nav aria-label="Filter by delivery" className="mb-4 flex gap-2 text-sm">
        {FILTERS.map((f) => (
          <AppLink
            key={f.label}
            href={f.state ? `/admin/outbox?state=${f.state}` : '/admin/outbox'}
            aria-current={f.state === state ? 'page' : undefined}
            className={`rounded-full border px-3 py-1 ${f.state === state ? 'border-lagoon-600 bg-lagoon-100 text-lagoon-700' : 'border-ink-300 text-ink-700 hover:bg-ink-100'}`}
          >
            {f.label}
          </AppLink>
        ))}
      </nav>
      {rows.length ? (
        <OutboxTable rows={rows} requeue={requeueMailAction} />
      ) : (
        <EmptyState title="No messages">Nothing matches this filter.</EmptyState>
      )}
    </>
  );
}
