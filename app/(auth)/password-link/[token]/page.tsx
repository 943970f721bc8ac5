import type { Metadata } from 'next';
import { AuthFrame } from '@/components/auth/auth-frame';
import { AppLink } from '@/components/ui/app-link';
import { MIN_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { passwordLinkState } from '@/lib/auth/password-link';
import { NewPasswordForm } from './new-password-form';

export const metadata: Metadata = { title: 'Choose a new password', referrer: 'no-referrer' };

const linkClass = 'text-lagoon-700 underline-offset-2 hover:underline';

/** The page a password link opens: the form while the link works, else why it does not. */
export default async function PasswordLinkPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const state = await passwordLinkState(token);
  if (!state.usable) {
    return (
      <AuthFrame title="This link does not work" intro="Nothing was changed.">
        <p role="alert" className="text-sm text-ink-800">
          {state.why}
        </p>
        <p className="mt-6 flex gap-4 text-sm">
          <AppLink href="/lost-password" className={linkClass}>
            Ask for a new link
          </AppLink>
          <AppLink href="/sign-in" className={linkClass}>
            Sign in
          </AppLink>
        </p>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame
      title="Choose a new password"
      intro={
        <>
          For <span className="font-medium text-ink-800">{state.email}</span>. Every session of this account
          ends when you set it.
        </>
      }
    >
      <NewPasswordForm token={token} email={state.email} minPasswordLength={MIN_PASSWORD_LENGTH} />
    </AuthFrame>
  );
}
