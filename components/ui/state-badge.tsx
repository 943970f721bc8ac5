import type { PlateState } from '@/models/plate';

const LOOK: Record<PlateState, { label: string; className: string }> = {
  imported: { label: 'Imported', className: 'bg-ink-100 text-ink-800 ring-ink-300' },
  verified: { label: 'Map verified', className: 'bg-lagoon-100 text-lagoon-700 ring-lagoon-500/40' },
  submitted: { label: 'Awaiting approval', className: 'bg-amber-50 text-signal-warn ring-amber-300' },
  approved: { label: 'Approved', className: 'bg-emerald-50 text-signal-pass ring-emerald-300' },
  rejected: { label: 'Returned', className: 'bg-red-50 text-signal-fail ring-red-300' },
};

/** A plate's sign-off state as a labelled badge (text carries the meaning, colour only helps). */
export function StateBadge({ state }: { state: PlateState }) {
  const look = LOOK[state];
  return (
    <span className={`inline-flex items-center rounded-full px-2.5 py-0.5 text-xs font-medium ring-1 ring-inset ${look.className}`}>
      {look.label}
    </span>
  );
}
