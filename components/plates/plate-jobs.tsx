'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useRef } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import { plateJobsSchema, type JobViewData, type PlateJobsData } from '@/lib/validation/jobs';
import { fitsKey, schemaFetcher, wellsKey } from './plate-data';

export const plateJobsKey = (plateId: string) => `/api/plates/${plateId}/jobs`;

/** A job that waits or runs. */
export const isOpen = (job: JobViewData | undefined): boolean =>
  job?.state === 'queued' || job?.state === 'running';

/** The plate's fit state and jobs; polled every second while a refit or a forecast run is under way. */
export function usePlateJobs(plateId: string, fitsPendingAtLoad: boolean) {
  return useSWR<PlateJobsData>(plateJobsKey(plateId), schemaFetcher(plateJobsSchema), {
    revalidateOnFocus: false,
    refreshInterval: (data) =>
      data ? (data.fitsPending || data.jobs.some(isOpen) ? 1000 : 0) : fitsPendingAtLoad ? 1000 : 0,
  });
}

function fitJobText(job: JobViewData | undefined): string {
  if (!job) return 'waiting for a worker to take the job';
  if (job.state === 'running') return `running${job.attempts > 1 ? `, attempt ${job.attempts}` : ''}`;
  if (job.state === 'failed')
    return `the last attempt failed (${job.message ?? 'no reason given'}); a worker retries it within a minute`;
  return job.message ? `queued: ${job.message}` : 'queued for the next free worker';
}

/**
 * A line under the plate's tabs while its fits are being recomputed after an import or a change:
 * where the job stands, and a refresh of the page's data once the fits are current again.
 */
export function PlateFitStatus({ plateId, fitsPending }: { plateId: string; fitsPending: boolean }) {
  const jobs = usePlateJobs(plateId, fitsPending);
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const pending = jobs.data?.fitsPending ?? fitsPending;
  const wasPending = useRef(fitsPending);
  useEffect(() => {
    if (wasPending.current && !pending) {
      void mutate(fitsKey(plateId));
      void mutate(wellsKey(plateId));
      router.refresh();
    }
    wasPending.current = pending;
  }, [pending, plateId, mutate, router]);

  if (!pending) return null;
  const fitJob = jobs.data?.jobs.find((j) => j.kind === 'plate-fits');
  return (
    <p
      role="status"
      aria-live="polite"
      data-testid="fit-status"
      className="mb-4 flex items-center gap-2 rounded-md border border-lagoon-500/30 bg-lagoon-100/60 px-3 py-2 text-sm text-ink-800"
    >
      <span
        aria-hidden="true"
        className="size-3 animate-spin rounded-full border-2 border-lagoon-700 border-t-transparent"
      />
      <span>
        <strong className="font-semibold">Refitting.</strong> The Hill fits are being recomputed after the
        last change ({fitJobText(fitJob)}). Fits, forecasts and signatures use them once they are current;
        this page updates by itself.
      </span>
    </p>
  );
}
