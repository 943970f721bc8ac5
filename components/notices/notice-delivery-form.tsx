'use client';

import { SubmitRow } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import type { FormAction } from '@/lib/actions/validated-action';
import { NOTICE_DELIVERIES, NOTICE_DELIVERY_LABELS, type NoticeDelivery } from '@/lib/domain/notices';

const EXPLAIN: Record<NoticeDelivery, string> = {
  mail_and_app: 'Each notice comes by e-mail too, with a link to the plate or import.',
  app_only: 'No e-mail: the bell at the top counts what is new, and the Notices page lists it.',
};

/** The person's choice of how notices about plates and imports reach them. */
export function NoticeDeliveryForm({ action, current }: { action: FormAction; current: NoticeDelivery }) {
  const { state, pending, formRef, onSubmit } = useFormAction(action);
  return (
    <form ref={formRef} onSubmit={onSubmit} className="space-y-3" noValidate>
      <fieldset>
        <legend className="sr-only">How you are told</legend>
        <div className="space-y-2">
          {NOTICE_DELIVERIES.map((delivery) => (
            <label key={delivery} className="flex items-start gap-2 text-sm">
              <input
                type="radio"
                name="delivery"
                value={delivery}
                defaultChecked={delivery === current}
                className="mt-1"
              />
              <span>
                <span className="font-medium">{NOTICE_DELIVERY_LABELS[delivery]}</span>
                <span className="block text-ink-700">{EXPLAIN[delivery]}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      {state.fieldErrors?.delivery ? (
        <p className="text-sm text-signal-fail">{state.fieldErrors.delivery.join(' ')}</p>
      ) : null}
      <SubmitRow
        label="Save"
        pendingLabel="Saving…"
        pending={pending}
        state={state}
        className="flex flex-wrap items-center gap-3"
      />
    </form>
  );
}
