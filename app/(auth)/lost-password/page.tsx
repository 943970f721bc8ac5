import type { Metadata } from 'next';
import { AuthFrame } from '@/components/auth/auth-frame';
import { AppLink } from '@/components/ui/app-link';
import { LINK_LIFETIME_MS } from '@/lib/auth/password-link';
import { LostPasswordForm } from './lost-password-form';

export const metadata: Metadata = { title: 'Lost password' };

export default function LostPasswordPage() {
  return (
    <AuthFrame
      title="Lost your password?"
      intro={`Gatewell e-mails you a link to choose a new one. The link works once, within ${LINK_LIFETIME_MS / 60_000} minutes; your password stays as it is until you use it.`}
    >
      <LostPasswordForm />
      <p className="mt-4 text-sm">
        <AppLink href="/sign-in" className="text-lagoon-700 underline-offset-2 hover:underline">
          Back to sign-in
        </AppLink>
      </p>
    </AuthFrame>
  );
}
