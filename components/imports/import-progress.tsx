'use client';

import type { WorkProgress, WorkStage } from './import-api';

/** The stages of each piece of work, in order, with what the person reads for each. */
const STAGES: Record<WorkProgress['work'], { stage: WorkStage; label: string }[]> = {
  inspect: [
    { stage: 'uploading', label: 'Uploading the file' },
    { stage: 'reading', label: 'Reading the file on the server' },
  ],
  preview: [{ stage: 'checking', label: 'Checking every row' }],
  commit: [
    { stage: 'queued', label: 'Waiting for a worker' },
    { stage: 'taking', label: 'Opening the file read at upload' },
    { stage: 'checking', label: 'Checking every row' },
    { stage: 'storing', label: 'Storing wells, readouts and QC' },
    { stage: 'fitting', label: 'Fitting the curves (followed on the plate’s page)' },
  ],
};

/**
 * Where the work the person started stands: its stages, those done ticked and the current one named,
 * with the percent sent while the file uploads. Stages come from the browser (upload) and the server
 * (the import job); no stage but the upload has a percent, and none is shown.
 */
export function ImportProgress({ progress }: { progress: WorkProgress | null }) {
  if (!progress) return null;
  const stages = STAGES[progress.work];
  const at = stages.findIndex((s) => s.stage === progress.stage);
  return (
    <div role="status" aria-label="Progress" className="text-sm">
      <ol className="flex flex-wrap items-center gap-x-4 gap-y-1">
        {stages.map((s, i) => {
          const state = i < at ? 'done' : i === at ? 'current' : 'next';
          return (
            <li
              key={s.stage}
              aria-current={state === 'current' ? 'step' : undefined}
              className={
                state === 'done'
                  ? 'text-signal-pass'
                  : state === 'current'
                    ? 'font-semibold text-lagoon-700'
                    : 'text-ink-500'
              }
            >
              {state === 'done' ? '✓ ' : state === 'current' ? '… ' : ''}
              {s.label}
              {state === 'current' && s.stage === 'uploading' && progress.percent !== undefined
                ? ` (${progress.percent} %)`
                : ''}
            </li>
          );
        })}
      </ol>
      {progress.stage === 'uploading' && progress.percent !== undefined ? (
        <progress
          className="mt-1 w-full max-w-sm accent-lagoon-700"
          max={100}
          value={progress.percent}
          aria-label="Part of the file sent"
        />
      ) : null}
    </div>
  );
}
