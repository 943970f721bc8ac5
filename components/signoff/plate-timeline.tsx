import type { HistoryEntry } from '@/lib/signoff/history';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });

const STEP_TITLES: Record<string, string> = {
  verify: 'Compound map verified',
  submit: 'Submitted for approval',
  approve: 'Approved',
  reject: 'Returned for rework',
  rework: 'Reopened for rework',
};

type Fields = Record<string, unknown> | null;
const field = (record: Fields, key: string) =>
  record && record[key] !== undefined && record[key] !== null ? String(record[key]) : '';

/** The QC warnings a signer acknowledged with a step (its audit event's `qcWarningsAcknowledged`). */
const acknowledged = (entry: HistoryEntry): string[] => {
  const list = entry.after?.qcWarningsAcknowledged;
  return Array.isArray(list) ? list.filter((w): w is string => typeof w === 'string') : [];
};

/** What one event says, in words: a title and a line of detail. */
function describe(entry: HistoryEntry): { title: string; detail: string } {
  const { action, before, after } = entry;
  if (STEP_TITLES[action])
    return {
      title: STEP_TITLES[action]!,
      detail: `State ${field(before, 'state')} → ${field(after, 'state')}, version ${field(after, 'version')}`,
    };
  switch (action) {
    case 'import':
      return {
        title: 'Imported',
        detail: `From ${field(after, 'filename')}: ${field(after, 'wells')} wells, ${field(after, 'readouts')} readouts, ${field(after, 'fits')} fits`,
      };
    case 'sign':
      return { title: 'Signed electronically', detail: entry.signature?.meaning ?? field(after, 'meaning') };
    case 'sign_failed':
      return {
        title: 'Signature refused',
        detail: 'The password was re-entered wrongly; nothing was signed.',
      };
    case 'exclude_well':
      return { title: `Well ${entry.wellPosition ?? ''} excluded`, detail: '' };
    case 'include_well':
      return { title: `Well ${entry.wellPosition ?? ''} re-included`, detail: '' };
    case 'change_fit_model':
      return { title: 'Fit model changed', detail: `${field(before, 'model')} → ${field(after, 'model')}` };
    default:
      return {
        title: action.replace(/_/g, ' '),
        detail: entry.entityType === 'well' ? `Well ${entry.wellPosition ?? ''}` : '',
      };
  }
}

/**
 * A step's audit event and the signature written with it in one transaction are shown as one entry
 * (the signature's meaning and data hash under the step); a signature without its step stands alone.
 */
function mergeSignatures(entries: HistoryEntry[]): HistoryEntry[] {
  const signatureOf = (entry: HistoryEntry) => field(entry.after, 'signatureId');
  const signs = new Map(entries.filter((e) => e.action === 'sign').map((e) => [signatureOf(e), e]));
  const stepped = new Set(entries.filter((e) => STEP_TITLES[e.action]).map(signatureOf));
  return entries
    .filter((e) => !(e.action === 'sign' && stepped.has(signatureOf(e))))
    .map((e) =>
      STEP_TITLES[e.action] ? { ...e, signature: signs.get(signatureOf(e))?.signature ?? null } : e,
    );
}

/** Every audit event and signature of the plate, oldest first, as the audit trail holds them. */
export function PlateTimeline({ entries }: { entries: HistoryEntry[] }) {
  return (
    <section aria-labelledby="history-heading">
      <h2 id="history-heading" className="mb-3 text-lg font-semibold">
        History
      </h2>
      <ol className="relative space-y-4 border-l-2 border-ink-100 pl-5">
        {mergeSignatures(entries).map((entry) => {
          const { title, detail } = describe(entry);
          const signed = entry.signature;
          return (
            <li key={entry.id} className="relative">
              <span
                aria-hidden
                className={`absolute -left-[27px] top-1.5 h-3 w-3 rounded-full ring-2 ring-paper ${signed ? 'bg-lagoon-600' : entry.action === 'sign_failed' ? 'bg-signal-fail' : 'bg-ink-300'}`}
              />
              <p className="text-sm">
                <span className="font-medium text-ink-950">{title}</span>
                <span className="text-ink-700">
                  {' '}
                  · {entry.actorName ?? 'system'} · {when.format(new Date(entry.occurredAt))} UTC
                </span>
              </p>
              {signed && entry.action !== 'sign' ? (
                <p className="text-sm text-ink-800">Signed: {signed.meaning}</p>
              ) : null}
              {detail ? <p className="text-sm text-ink-800">{detail}</p> : null}
              {entry.reason && entry.action !== 'sign_failed' ? (
                <p className="text-sm text-ink-950">
                  {STEP_TITLES[entry.action] ? 'Comment' : 'Reason'}: “{entry.reason}”
                </p>
              ) : null}
              {acknowledged(entry).length ? (
                <div className="text-sm text-signal-warn">
                  QC warnings acknowledged when signing:
                  <ul className="list-disc pl-5 text-ink-800">
                    {acknowledged(entry).map((w) => (
                      <li key={w}>{w}</li>
                    ))}
                  </ul>
                </div>
              ) : null}
              {signed ? (
                <p className="mt-0.5 text-xs text-ink-500">
                  Data fingerprint (SHA-256){' '}
                  <span className="font-mono" title={signed.contentSha256}>
                    {signed.contentSha256.slice(0, 12)}…
                  </span>
                </p>
              ) : null}
            </li>
          );
        })}
      </ol>
    </section>
  );
}
