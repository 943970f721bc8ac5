'use client';

import { BusyButton } from '@/components/ui/busy-button';
import { useFormAction } from '@/components/forms/use-form-action';
import type { FormAction } from '@/lib/actions/validated-action';
import { NOTICE_LINK_LABELS, NOTICE_STATE_LABELS, type NoticeItem } from '@/lib/domain/notices';
import { formatInZone } from '@/lib/domain/time-zone';

/** A one-button form on one notice (or on all): the notice rides in a hidden field, never shown. */
function NoticeButton({
  action,
  noticeId,
  upTo,
  label,
  busyLabel,
  quiet,
}: {
  action: FormAction;
  noticeId?: string;
  /** For "mark all seen": the newest notice the page showed. */
  upTo?: string;
  label: string;
  busyLabel: string;
  quiet?: boolean;
}) {
  // The actions render the layout again (revalidatePath), so the bell's count follows.
  const { state, pending, formRef, onSubmit } = useFormAction(action);
  return (
    <form ref={formRef} onSubmit={onSubmit} className="inline-flex items-center gap-2">
      {noticeId ? <input type="hidden" name="noticeId" value={noticeId} /> : null}
      {upTo ? <input type="hidden" name="upTo" value={upTo} /> : null}
      <BusyButton
        type="submit"
        busy={pending}
        busyLabel={busyLabel}
        className={quiet ? 'gw-button-quiet px-3 py-1' : 'gw-button'}
      >
        {label}
      </BusyButton>
      {state.message && !state.ok ? (
        <span role="alert" className="text-sm text-signal-fail">
          {state.message}
        </span>
      ) : null}
    </form>
  );
}

/** "Mark every notice seen" (those the page showed and older), for the page's header. */
export function MarkAllSeenButton({ action, upTo }: { action: FormAction; upTo: string }) {
  return <NoticeButton action={action} upTo={upTo} label="Mark all seen" busyLabel="Marking…" quiet />;
}

/** The person's notices, newest first: each opens its plate or import (and is then seen), or is marked seen. */
export function NoticeList({
  items,
  timeZone,
  openAction,
  markSeenAction,
}: {
  items: NoticeItem[];
  timeZone: string;
  openAction: FormAction;
  markSeenAction: FormAction;
}) {
  return (
    <ul className="space-y-3">
      {items.map((item) => (
        <li
          key={item.id}
          aria-label={item.title}
          className={`gw-card p-4 ${item.seen ? '' : 'border-l-4 border-l-lagoon-500'}`}
        >
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 className="text-base font-semibold">
              <span
                className={`mr-2 inline-flex items-center rounded-full px-2 py-0.5 align-middle text-xs font-medium ring-1 ring-inset ${
                  item.seen
                    ? 'bg-ink-100 text-ink-700 ring-ink-300'
                    : 'bg-lagoon-100 text-lagoon-700 ring-lagoon-500/40'
                }`}
              >
                {item.seen ? NOTICE_STATE_LABELS.seen : NOTICE_STATE_LABELS.unseen}
              </span>
              {item.title}
            </h2>
            <time dateTime={item.createdAt} className="text-xs text-ink-700">
              {formatInZone(item.createdAt, timeZone)}
            </time>
          </div>
          <p className="mt-1 text-sm text-ink-800">{item.summary}</p>
          <div className="mt-3 flex flex-wrap items-center gap-3">
            <NoticeButton
              action={openAction}
              noticeId={item.id}
              label={NOTICE_LINK_LABELS[item.kind]}
              busyLabel="Opening…"
            />
            {item.seen ? null : (
              <NoticeButton
                action={markSeenAction}
                noticeId={item.id}
                label="Mark seen"
                busyLabel="Marking…"
                quiet
              />
            )}
          </div>
        </li>
      ))}
    </ul>
  );
}
