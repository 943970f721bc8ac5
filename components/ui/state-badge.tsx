import { PLATE_STATE_LABEL, type PlateState } from '@/lib/domain/plate-states';

const TONE: Record<PlateState, string> = {
  imported: 'bg-ink-100 text-ink-800 ring-ink-300',
  verified: 'bg-lagoon-100 text-lagoon-700 ring-lagoon-500/40',
  submitted: 'bg-amber-50 text-signal-warn ring-amber-300',
  approved: 'bg-emerald-50 text-signal-pass ring-emerald-300',
  rejected: 'bg-red-50 text-signal-fail ring-red-300',
};

/** A plate's sign-off state as a labelled badge (text carries the meaning, colour only helps). */
export function StateBadge({ state }: { state: PlateState }) {
  return (
    <span
      className={`inline-flex items-center rounded-full px-2.5 py-0.5 text-xs font-medium ring-1 ring-inset ${TONE[state]}`}
    >
      {PLATE_STATE_LABEL[state]}
    </span>
  );
}
