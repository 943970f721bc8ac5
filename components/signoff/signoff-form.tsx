'use client';

import { startTransition, useActionState, useRef, useState, type FormEvent } from 'react';
import { FormMessage } from '@/components/forms/field';
import type { ActionState, FormAction } from '@/lib/actions/validated-action';
import type { SignoffAction } from '@/lib/domain/plate-states';
import { BusyButton } from '@/components/ui/busy-button';

export interface FormQcWarning {
  key: string;
  message: string;
}

/** The plate's QC warnings, as the sign-off panel shows them before anyone signs. */
export function QcWarningList({ warnings }: { warnings: FormQcWarning[] }) {
  return (
    <div
      role="note"
      aria-labelledby="signoff-qc-heading"
      className="rounded-md border border-amber-300 bg-amber-50 p-3 text-sm"
    >
      <p id="signoff-qc-heading" className="font-semibold text-signal-warn">
        QC {warnings.length === 1 ? 'warning' : `warnings (${warnings.length})`}: read before you sign
      </p>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-ink-800">
        {warnings.map((w) => (
          <li key={w.key}>{w.message}</li>
        ))}
      </ul>
    </div>
  );
}

export interface FormChoice {
  action: SignoffAction;
  label: string;
  meaning: string;
  commentRequired: boolean;
}

/**
 * The e-signature area of the sign-off panel: the form for this person's step (choose it, read its
 * meaning, comment, re-enter the password) and the answer of the last signature, which stays in view
 * after the panel re-renders with the plate's new state.
 */
export function SignoffForm({
  action,
  plateId,
  version,
  choices,
  notYours,
  qcWarnings,
  qcWarningKeys,
}: {
  action: FormAction;
  plateId: string;
  version: number;
  choices: FormChoice[];
  notYours: string | null;
  qcWarnings: FormQcWarning[];
  qcWarningKeys: string;
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const form = useRef<HTMLFormElement>(null);
  // Submitted by hand rather than through <form action>, which would reset the chosen step and comment
  // after a refusal; only the password is cleared, to be entered again.
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const password = form.current?.elements.namedItem('password');
    if (password instanceof HTMLInputElement) password.value = '';
    startTransition(() => formAction(data));
  };
  return (
    <div className="space-y-3">
      {choices.length ? (
        <form ref={form} onSubmit={submit} className="space-y-4" noValidate aria-label="Sign this step">
          <input type="hidden" name="plateId" value={plateId} />
          <input type="hidden" name="expectedVersion" value={version} />
          <input type="hidden" name="qcWarningsShown" value={qcWarningKeys} />
          <StepFields
            key={version}
            choices={choices}
            qcWarnings={qcWarnings}
            errors={state.fieldErrors ?? {}}
            pending={pending}
          />
        </form>
      ) : notYours ? (
        <p className="rounded-md border border-ink-100 bg-paper p-3 text-sm text-ink-800">{notYours}</p>
      ) : null}
      <FormMessage ok={state.ok} message={state.message} />
    </div>
  );
}

function StepFields({
  choices,
  qcWarnings,
  errors: e,
  pending,
}: {
  choices: FormChoice[];
  qcWarnings: FormQcWarning[];
  errors: NonNullable<ActionState['fieldErrors']>;
  pending: boolean;
}) {
  const [chosen, setChosen] = useState<SignoffAction>(choices[0]!.action);
  const [comment, setComment] = useState('');
  const choice = choices.find((c) => c.action === chosen) ?? choices[0]!;
  return (
    <>
      {choices.length > 1 ? (
        <fieldset>
          <legend className="gw-label">Your decision</legend>
          <div className="mt-2 flex flex-wrap gap-3">
            {choices.map((c) => (
              <label
                key={c.action}
                className={`flex cursor-pointer items-center gap-2 rounded-md border px-3 py-2 text-sm ${chosen === c.action ? 'border-lagoon-600 bg-lagoon-100/60' : 'border-ink-300'}`}
              >
                <input
                  type="radio"
                  name="action"
                  value={c.action}
                  checked={chosen === c.action}
                  onChange={() => setChosen(c.action)}
                />
                {c.label}
              </label>
            ))}
          </div>
        </fieldset>
      ) : (
        <input type="hidden" name="action" value={choice.action} />
      )}
      <div className="rounded-md border border-ink-100 bg-paper p-3 text-sm">
        <p className="text-xs font-semibold uppercase tracking-wide text-ink-500">
          Meaning of your signature
        </p>
        <p className="mt-1 text-ink-900">{choice.meaning}</p>
      </div>
      <div>
        <label htmlFor="signoff-comment" className="gw-label">
          Comment{choice.commentRequired ? ' (required: say what needs rework)' : ' (optional)'}
        </label>
        <textarea
          id="signoff-comment"
          name="comment"
          rows={3}
          value={comment}
          onChange={(event) => setComment(event.target.value)}
          aria-invalid={e.comment?.length ? true : undefined}
          aria-describedby="signoff-comment-error"
          className="gw-input mt-1"
        />
        <p id="signoff-comment-error" aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
          {e.comment?.join(' ')}
        </p>
      </div>
      <div>
        <label htmlFor="signoff-password" className="gw-label">
          Your password, to sign
        </label>
        <input
          id="signoff-password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          aria-invalid={e.password?.length ? true : undefined}
          aria-describedby="signoff-password-error"
          className="gw-input mt-1 max-w-sm"
        />
        <p id="signoff-password-error" aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
          {e.password?.join(' ')}
        </p>
      </div>
      {qcWarnings.length ? (
        <div className="space-y-2">
          <QcWarningList warnings={qcWarnings} />
          <label className="flex items-start gap-2 text-sm text-ink-900">
            <input
              type="checkbox"
              name="acknowledgeQcWarnings"
              value="yes"
              className="mt-0.5"
              aria-invalid={e.acknowledgeQcWarnings?.length ? true : undefined}
              aria-describedby="signoff-acknowledge-error"
            />
            <span>
              I read {qcWarnings.length === 1 ? 'this QC warning' : 'these QC warnings'} and sign knowing{' '}
              {qcWarnings.length === 1 ? 'it' : 'them'}; my signature records that I saw{' '}
              {qcWarnings.length === 1 ? 'it' : 'them'}.
            </span>
          </label>
          <p id="signoff-acknowledge-error" aria-live="polite" className="min-h-4 text-xs text-signal-fail">
            {e.acknowledgeQcWarnings?.join(' ')}
          </p>
        </div>
      ) : null}
      <BusyButton type="submit" busy={pending} busyLabel="Signing…">
        {`Sign: ${choice.label}`}
      </BusyButton>
    </>
  );
}
