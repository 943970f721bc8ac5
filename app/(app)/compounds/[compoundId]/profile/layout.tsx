import { notFound } from 'next/navigation';
import type { ReactNode } from 'react';
import { requireActor } from '@/lib/auth/current-actor';
import { getCompound } from '@/lib/compounds/service';
import { isAppError } from '@/lib/errors';
import { parseId } from '@/lib/validation/ids';

// Outside the profile's loading boundary: a compound that does not exist answers 404 before the
// fallback streams (once streaming has begun, the status is already 200).
export default async function CompoundProfileLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ compoundId: string }>;
}) {
  try {
    await getCompound(await requireActor(), parseId((await params).compoundId, 'compound'));
  } catch (error) {
    if (isAppError(error) && error.code === 'not_found') notFound();
    throw error;
  }
  return children;
}
