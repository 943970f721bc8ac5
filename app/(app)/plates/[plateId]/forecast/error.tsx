'use client';

import { RouteError } from '@/components/ui/route-error';

export default function ForecastError(props: { error: Error & { digest?: string }; retry: () => void }) {
  return <RouteError what="The forecast tab" heading="h2" {...props} />;
}
