import { AppLink } from '@/components/ui/app-link';
import { DataTable } from '@/components/ui/data-table';
import type { FormAction } from '@/lib/actions/validated-action';
import type { OutboxRow } from '@/lib/mail/admin';
import { OutboxButton } from './outbox-buttons';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });
const at = (iso: string | null) => (iso ? `${when.format(new Date(iso))} UTC` : '');

/** Delivery state in words; colour only helps. A queued message that has failed before is retrying. */
function DeliveryState({ row }: { row: OutboxRow }) {
  const look =
    row.state === 'sent'
      ? { text: 'Sent', cls: 'bg-emerald-50 text-signal-pass ring-emerald-300' }
      : row.state === 'failed'
        ? { text: 'Gave up', cls: 'bg-red-50 text-signal-fail ring-red-300' }
        : row.attempts > 0
          ? { text: 'Retrying', cls: 'bg-amber-50 text-signal-warn ring-amber-300' }
          : { text: 'Queued', cls: 'bg-ink-100 text-ink-800 ring-ink-300' };
  return (
    <span
      className={`inline-flex rounded-full px-2.5 py-0.5 text-xs font-medium ring-1 ring-inset ${look.cls}`}
    >
      {look.text}
    </span>
  );
}

/** The outbox, newest first: to whom, about what, and how delivery went. */
export function OutboxTable({ rows, requeue }: { rows: OutboxRow[]; requeue: FormAction }) {
  return (
    <DataTable
      caption="Mail outbox"
      rows={rows}
      rowKey={(row) => row.id}
      columns={[
        { header: 'Queued (UTC)', cell: (r) => <span className="whitespace-nowrap">{at(r.createdAt)}</span> },
        {
          header: 'To',
          cell: (r) => (
            <span>
              {r.recipientName}
              <br />
              <span className="text-xs text-ink-500">{r.toAddress}</span>
            </span>
          ),
        },
        {
          header: 'Subject',
          cell: (r) =>
            r.plateId ? (
              <AppLink className="text-lagoon-700 hover:underline" href={`/plates/${r.plateId}/history`}>
                {r.subject}
              </AppLink>
            ) : (
              r.subject
            ),
        },
        { header: 'Delivery', cell: (r) => <DeliveryState row={r} /> },
        { header: 'Attempts', cell: (r) => `${r.attempts} of ${r.maxAttempts}`, align: 'right' },
        {
          header: 'Details',
          cell: (r) => (
            <div className="max-w-xs text-xs text-ink-700">
              {r.state === 'sent' ? (
                <p>
                  {at(r.sentAt)} · {r.smtpResponse}
                </p>
              ) : null}
              {r.state === 'queued' && r.nextAttemptAt ? <p>Next attempt {at(r.nextAttemptAt)}</p> : null}
              {r.lastError && r.state !== 'sent' ? <p className="text-signal-fail">{r.lastError}</p> : null}
              {r.state === 'failed' ? (
                <OutboxButton
                  action={requeue}
                  label="Send again"
                  busyLabel="Sending…"
                  fields={{ messageId: r.id }}
                  quiet
                />
              ) : null}
            </div>
          ),
        },
      ]}
    />
  );
}
