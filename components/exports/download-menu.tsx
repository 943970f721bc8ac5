import { DownloadButton } from './download-button';
const TABLES = {
  plate: [
    ['wells', 'Wells'],
    ['fits', 'Fits'],
    ['forecast', 'Forecast at exposures'],
    ['signoff', 'Sign-off'],
  ],
  compound: [
    ['potency', 'Potency across plates'],
    ['selectivity', 'Selectivity'],
    ['forecast', 'Forecast at exposures'],
    ['signoff', 'Sign-off'],
  ],
} as const;

/**
 * Downloads of a plate or a compound profile: the whole workbook, or one table as csv. A disclosure
 * (keyboard and screen-reader friendly without script); each file carries the caution, states and signatures.
 */
export function DownloadMenu({ kind, id }: { kind: 'plate' | 'compound'; id: string }) {
  const base = `/api/${kind === 'plate' ? 'plates' : 'compounds'}/${id}/export`;
  return (
    <details className="relative">
      <summary className="gw-button-quiet cursor-pointer list-none [&::-webkit-details-marker]:hidden">
        Download <span aria-hidden="true">▾</span>
      </summary>
      <div className="absolute right-0 z-20 mt-1 w-72 rounded-md border border-ink-100 bg-card p-2 text-sm shadow-lg">
        <ul>
          <li>
            <DownloadButton
              className="w-full rounded px-3 py-2 text-left font-medium hover:bg-paper"
              href={`${base}?format=xlsx`}
            >
              Workbook with every table (xlsx)
            </DownloadButton>
          </li>
          {TABLES[kind].map(([key, label]) => (
            <li key={key}>
              <DownloadButton
                className="w-full rounded px-3 py-2 text-left hover:bg-paper"
                href={`${base}?format=csv&table=${key}`}
              >
                {label} (csv)
              </DownloadButton>
            </li>
          ))}
        </ul>
        <p className="border-t border-ink-100 px-3 pt-2 text-xs text-ink-500">
          Every file carries the research-use caution
          {kind === 'plate'
            ? ', the plate’s state and its signatures'
            : ', each plate’s state and its signatures'}
          .{' '}
          {kind === 'plate'
            ? 'The workbook and the forecast table compute missing forecasts first, which can take a few seconds.'
            : 'Missing forecasts are computed first, which can take a few seconds.'}
        </p>
      </div>
    </details>
  );
}
