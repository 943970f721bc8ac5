import type { SignoffPanelData } from '@/lib/signoff/panel';
import { PLATE_STATE_PATH, PLATE_STATE_STATION, type PlateState } from '@/lib/domain/plate-states';

/** The four stations of sign-off with who signed each in this round; a returned plate shows its return last. */
export function SignoffSteps({
  state,
  signers,
}: {
  state: PlateState;
  signers: SignoffPanelData['signers'];
}) {
  const reached = state === 'rejected' ? 3 : PLATE_STATE_PATH.indexOf(state);
  const stations = [
    { name: PLATE_STATE_STATION.imported, by: signers.importedBy },
    { name: PLATE_STATE_STATION.verified, by: signers.verifiedBy },
    { name: PLATE_STATE_STATION.submitted, by: signers.submittedBy },
    { name: PLATE_STATE_STATION[state === 'rejected' ? 'rejected' : 'approved'], by: signers.decidedBy },
  ];
  return (
    <ol className="grid gap-2 sm:grid-cols-4" aria-label="Sign-off steps">
      {stations.map((station, index) => {
        const done = index <= reached && station.by !== null;
        const current = index === reached;
        const tone =
          state === 'rejected' && index === 3
            ? 'border-signal-fail/50 bg-red-50'
            : done
              ? 'border-lagoon-500/50 bg-lagoon-100/50'
              : 'border-ink-100 bg-card';
        return (
          <li
            key={station.name}
            aria-current={current ? 'step' : undefined}
            className={`rounded-md border p-2.5 text-sm ${tone} ${current ? 'ring-2 ring-lagoon-500/40' : ''}`}
          >
            <p className="font-medium text-ink-900">
              {index + 1}. {station.name}
            </p>
            <p className="text-xs text-ink-700">{done ? `by ${station.by}` : 'not yet'}</p>
          </li>
        );
      })}
    </ol>
  );
}
