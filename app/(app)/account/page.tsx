import type { Metadata } from 'next';
import { PageHeader } from '@/components/ui/page-header';
import { NoticeDeliveryForm } from '@/components/notices/notice-delivery-form';
import { ROLE_CHOICES } from '@/components/users/role-choices';
import { requireActor } from '@/lib/auth/current-actor';
import { MIN_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { noticeDeliveryOf } from '@/lib/notices/service';
import { changePasswordAction, setNoticeDeliveryAction } from './actions';
import { ChangePasswordForm } from './change-password-form';

export const metadata: Metadata = { title: 'Account' };

export default async function AccountPage() {
  const actor = await requireActor();
  const roles = ROLE_CHOICES.filter((choice) => actor.roles.includes(choice.role));
  const delivery = await noticeDeliveryOf(actor);
  return (
    <>
      <PageHeader title="Account" intro={`Signed in as ${actor.name} (${actor.email}).`} />
      {actor.passwordChangeRequired ? (
        <p
          role="alert"
          className="mb-4 rounded-md border border-amber-300 bg-amber-50 px-4 py-3 text-sm text-ink-800"
        >
          <strong className="font-semibold">Choose your own password first.</strong> An administrator set the
          password you signed in with; it is good for this sign-in only. Enter it as your current password
          below and choose your own; then the rest of Gatewell opens.
        </p>
      ) : null}
      <div className="grid gap-4 xl:grid-cols-2">
        <section className="gw-card p-5" aria-labelledby="roles-heading">
          <h2 id="roles-heading" className="text-lg font-semibold">
            Your roles
          </h2>
          {roles.length ? (
            <ul className="mt-2 space-y-1 text-sm">
              {roles.map((choice) => (
                <li key={choice.role}>
                  <span className="font-medium">{choice.label}</span> — {choice.duty}
                </li>
              ))}
            </ul>
          ) : (
            <p className="mt-2 text-sm text-ink-700">
              No role: you can read results. An administrator grants roles.
            </p>
          )}
        </section>
        <section className="gw-card p-5" aria-labelledby="password-heading">
          <h2 id="password-heading" className="text-lg font-semibold">
            Change password
          </h2>
          <p className="mb-3 mt-1 text-sm text-ink-700">
            Every other session of yours ends; this one stays signed in.
          </p>
          <ChangePasswordForm action={changePasswordAction} minPasswordLength={MIN_PASSWORD_LENGTH} />
        </section>
        <section className="gw-card p-5" aria-labelledby="notices-heading">
          <h2 id="notices-heading" className="text-lg font-semibold">
            How you are told
          </h2>
          <p className="mb-3 mt-1 text-sm text-ink-700">
            Notices about your plates, plates you may sign next and imports waiting for compounds always
            appear under the bell at the top. No e-mail is needed for the record: every sign-off is in the
            audit trail whichever you choose. Password links and invitations always come by e-mail.
          </p>
          <NoticeDeliveryForm action={setNoticeDeliveryAction} current={delivery} />
        </section>
      </div>
    </>
  );
}
