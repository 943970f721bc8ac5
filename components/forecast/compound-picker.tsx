import type { PlateForecastList } from '@/lib/validation/forecasts';

type Entry = PlateForecastList['compounds'][number];

function statusOf(c: Entry): { text: string; className: string } {
  if (c.reason) return { text: 'No usable IC50', className: 'text-signal-warn' };
  return c.stored
    ? { text: 'Forecast stored', className: 'text-signal-pass' }
    : { text: 'Not computed yet', className: 'text-ink-500' };
}

/** The plate's compounds as buttons; picking one shows (and if needed computes) its forecast. */
export function CompoundPicker({
  compounds,
  selected,
  onPick,
}: {
  compounds: Entry[];
  selected: string | null;
  onPick: (compoundId: string) => void;
}) {
  return (
    <nav aria-label="Compounds on this plate">
      <ul className="flex flex-wrap gap-2 lg:flex-col lg:gap-1">
        {compounds.map((c) => {
          const status = statusOf(c);
          const active = c.compoundId === selected;
          return (
            <li key={c.compoundId}>
              <button
                type="button"
                aria-pressed={active}
                onClick={() => onPick(c.compoundId)}
                className={`w-full rounded-md border px-3 py-2 text-left text-sm ${active ? 'border-lagoon-600 bg-lagoon-100' : 'border-ink-100 bg-card hover:bg-paper'}`}
              >
                <span className="block font-mono font-medium text-ink-950">{c.compound}</span>
                {/* On the chosen (tinted) button the status is dark ink: the signal colours lack contrast there. */}
                <span className={`block text-xs ${active ? 'text-ink-800' : status.className}`}>
                  {status.text}
                </span>
              </button>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
