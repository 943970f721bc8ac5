'use client';

import { RouteError } from '@/components/ui/route-error';

export default function CompoundProfileError(props: {
  error: Error & { digest?: string };
  retry: () => void;
}) {
  return <RouteError what="The compound profile" {...props} />;
}
