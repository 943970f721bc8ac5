import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { AuthFrame } from '@/components/auth/auth-frame';
import { AppLink } from '@/components/ui/app-link';
import { currentActor } from '@/lib/auth/current-actor';
import { safeNextPath } from '@/lib/validation/auth';
import { SignInForm } from './sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ next?: string; password?: string }>;
}) {
  const { next, password } = await searchParams;
  if (await currentActor()) redirect(safeNextPath(next));
  return (
    <AuthFrame title="Sign in to Gatewell" intro="Use the e-mail address your administrator registered.">
      {password === 'set' ? (
        <p
          role="status"
          className="mb-4 rounded-md border border-lagoon-100 bg-lagoon-100 p-3 text-sm font-medium text-lagoon-700"
        >
          Your new password is set, and every earlier session has ended. Sign in with it.
        </p>
      ) : null}
      <SignInForm next={safeNextPath(next)} />
      <p className="mt-4 text-sm">
        <AppLink href="/lost-password" className="text-lagoon-700 underline-offset-2 hover:underline">
          Lost your password?
        </AppLink>
      </p>
    </AuthFrame>
  );
}
