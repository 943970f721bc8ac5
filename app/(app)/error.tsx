'use client';

import { RouteError } from '@/components/ui/route-error';

export default function PageError(props: { error: Error & { digest?: string }; retry: () => void }) {
  return <RouteError what="This page" {...props} />;
}
