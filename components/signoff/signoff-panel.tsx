import { StateBadge } from '@/components/ui/state-badge';
import type { FormAction } from '@/lib/actions/validated-action';
import type { SignoffPanelData } from '@/lib/signoff/panel';
import { QcWarningList, SignoffForm } from './signoff-form';
import { SignoffSteps } from './signoff-steps';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });
const short = (sha: string) => `${sha.slice(0, 12)}…`;

/** Where the plate stands in sign-off, whether its data still match the last signature, and the form for this person's step. */
export function SignoffPanel({ data, action }: { data: SignoffPanelData; action: FormAction }) {
  const last = data.lastSignature;
  const unchanged = last?.contentSha256 === data.currentSha256;
  return (
    <section aria-labelledby="signoff-heading" className="gw-card space-y-5 p-5">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="signoff-heading" className="text-lg font-semibold">
          Sign-off
        </h2>
        <StateBadge state={data.state} />
      </div>
      <SignoffSteps state={data.state} signers={data.signers} />
      <p className="text-sm text-ink-800" role="status">
        {data.waitingFor}
      </p>
      <div className="text-sm">
        <p className="text-xs font-semibold uppercase tracking-wide text-ink-500">Plate data</p>
        <p className="mt-1">
          SHA-256 now{' '}
          <span className="font-mono" title={data.currentSha256}>
            {short(data.currentSha256)}
          </span>
          {last ? (
            unchanged ? (
              <span className="text-signal-pass">
                {' '}
                · unchanged since {last.signerName} signed ({when.format(new Date(last.signedAt))} UTC)
              </span>
            ) : (
              <span className="text-signal-warn">
                {' '}
                · changed since {last.signerName} signed{' '}
                <span className="font-mono">{short(last.contentSha256)}</span> (
                {when.format(new Date(last.signedAt))} UTC)
              </span>
            )
          ) : (
            <span className="text-ink-500"> · not signed yet</span>
          )}
        </p>
      </div>
      {/* Someone who signs reads the warnings beside the sign button; anyone else reads them here. */}
      {data.qcWarnings.length && !data.choices.length ? <QcWarningList warnings={data.qcWarnings} /> : null}
      <SignoffForm
        action={action}
        plateId={data.plateId}
        version={data.version}
        choices={data.choices}
        notYours={data.notYours}
        qcWarnings={data.qcWarnings}
        qcWarningKeys={data.qcWarningKeys}
      />
    </section>
  );
}
