'use client';

import { useState } from 'react';
import { useSWRConfig } from 'swr';
import { fitsKey, postJson, usePlateFits, usePlateWells, wellsKey } from '@/components/plates/plate-data';
import type { FitView } from '@/lib/validation/plates';
import { DataTable } from '@/components/ui/data-table';
import { plateJobsKey } from '@/components/plates/plate-jobs';
import { SvgDownloadButton } from '@/components/ui/svg-download-button';
import { BLOCK_READOUT_LABEL, READOUT_RATIO_MEANING, readoutRatio } from '@/lib/domain/fits';
import { DoseResponsePlot } from './dose-response-plot';

const STATUS_TEXT: Record<FitView['status'], string> = {
  fitted: 'Fitted',
  above_range: 'Above tested range',
  inactive: 'Inactive',
  insufficient: 'Too few concentrations',
  not_converged: 'Did not converge',
};

const num = (v: number | null, digits = 3) => (v === null ? '—' : v.toPrecision(digits));

function ic50Text(fit: FitView): string {
  if (fit.status === 'fitted')
    return `${num(fit.ic50_uM)} µM (95 % CI ${num(fit.ic50CiLow_uM)}–${num(fit.ic50CiHigh_uM)})`;
  if (fit.ic50LowerBound_uM !== null) return `> ${num(fit.ic50LowerBound_uM)} µM`;
  return '—';
}

/** A readout's name for people: the screen's name, else the readout's own words. */
const readoutText = (f: FitView) => f.readoutName ?? BLOCK_READOUT_LABEL[f.readout];

/** The compound × target pairs of the plate with both readouts fitted, tonic first. */
function readoutPairs(fits: readonly FitView[]): { tonic: FitView; useDependent: FitView }[] {
  return fits.flatMap((tonic) => {
    if (tonic.readout !== 'tonic') return [];
    const useDependent = fits.find(
      (f) =>
        f.readout === 'use_dependent' && f.compoundId === tonic.compoundId && f.targetId === tonic.targetId,
    );
    return useDependent ? [{ tonic, useDependent }] : [];
  });
}

/** The ratio tonic IC50 ÷ use-dependent IC50 as text, or why there is none. */
function ratioText(pair: { tonic: FitView; useDependent: FitView }): string {
  const ratio = readoutRatio(
    pair.tonic.status === 'fitted' ? pair.tonic.ic50_uM : null,
    pair.useDependent.status === 'fitted' ? pair.useDependent.ic50_uM : null,
  );
  return ratio === null ? 'no ratio: an IC50 is not an estimate' : `${ratio.toPrecision(3)}×`;
}

/** Every compound × target fit of the plate: plot, numbers, status and the model switch. */
export function FitsPanel({ plateId, canEdit }: { plateId: string; canEdit: boolean }) {
  const fits = usePlateFits(plateId);
  const wells = usePlateWells(plateId);
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<string | null>(null);
  if (fits.error || wells.error)
    return (
      <p role="alert" className="text-signal-fail">
        The fits could not be loaded: {(fits.error ?? wells.error)?.message}
      </p>
    );
  if (!fits.data || !wells.data)
    return (
      <p role="status" className="text-sm text-ink-500">
        Loading fits…
      </p>
    );
  const editable = canEdit && ['imported', 'verified', 'rejected'].includes(fits.data.state);
  const allWells = wells.data.wells;

  async function switchModel(fit: FitView, model: 'hill2' | 'hill4') {
    setMessage(null);
    try {
      await postJson(`/api/plates/${plateId}/fit-model`, {
        compoundId: fit.compoundId,
        targetId: fit.targetId,
        model,
        expectedVersion: fits.data!.version,
      });
      await Promise.all([mutate(fitsKey(plateId)), mutate(wellsKey(plateId)), mutate(plateJobsKey(plateId))]);
    } catch (e) {
      setMessage(e instanceof Error ? e.message : 'The change failed.');
    }
  }

  if (!fits.data.fits.length) {
    return fits.data.fitsPending ? (
      <p role="status" className="text-sm text-ink-700">
        The fits of this plate are being computed; they appear here when the job is done.
      </p>
    ) : (
      <p className="text-sm text-ink-700">This plate has no test compounds to fit.</p>
    );
  }
  const pairs = readoutPairs(fits.data.fits);
  const twoReadouts = fits.data.fits.some((f) => f.readout === 'use_dependent');
  // A use-dependent fit is drawn on its tonic fit's card; one without a tonic fit has a card of its own.
  const cards = fits.data.fits.filter(
    (f) => f.readout === 'tonic' || !pairs.some((p) => p.useDependent.id === f.id),
  );
  const wellsOf = (f: FitView) =>
    allWells.filter(
      (w) => w.compoundId === f.compoundId && w.targetId === f.targetId && w.readout === f.readout,
    );
  return (
    <div className="space-y-4">
      <p role="status" aria-live="polite" className="min-h-5 text-sm text-signal-fail">
        {message}
      </p>
      {pairs.length ? (
        <section aria-labelledby="use-dependence-heading" className="space-y-2">
          <h3 id="use-dependence-heading" className="font-semibold">
            Use dependence
          </h3>
          <p className="text-sm text-ink-700">{READOUT_RATIO_MEANING}</p>
          <DataTable
            caption="Tonic and use-dependent IC50 per compound and target"
            rows={pairs}
            rowKey={(p) => p.tonic.id}
            columns={[
              { header: 'Compound', cell: (p) => <span className="font-mono">{p.tonic.compound}</span> },
              { header: 'Target', cell: (p) => p.tonic.target },
              { header: 'Tonic IC50', cell: (p) => `${readoutText(p.tonic)}: ${ic50Text(p.tonic)}` },
              {
                header: 'Use-dependent IC50',
                cell: (p) => `${readoutText(p.useDependent)}: ${ic50Text(p.useDependent)}`,
              },
              { header: 'Tonic ÷ use-dependent', cell: (p) => ratioText(p), align: 'right' },
            ]}
          />
        </section>
      ) : null}
      <DataTable
        caption="Fit results"
        rows={fits.data.fits}
        rowKey={(f) => f.id}
        columns={[
          {
            header: 'Compound',
            cell: (f) => (
              <a href={`#fit-${f.id}`} className="font-mono text-lagoon-700 hover:underline">
                {f.compound}
              </a>
            ),
          },
          { header: 'Target', cell: (f) => f.target },
          ...(twoReadouts ? [{ header: 'Readout', cell: (f: FitView) => readoutText(f) }] : []),
          { header: 'Model', cell: (f) => (f.model === 'hill2' ? '2-parameter' : '4-parameter') },
          { header: 'Status', cell: (f) => STATUS_TEXT[f.status] },
          { header: 'IC50', cell: (f) => ic50Text(f) },
          { header: 'Hill slope', cell: (f) => num(f.hill), align: 'right' },
          { header: 'R²', cell: (f) => num(f.r2), align: 'right' },
          { header: 'n', cell: (f) => f.n, align: 'right' },
          {
            header: 'Message',
            cell: (f) => (
              <span className="text-xs">{[f.message, ...f.flags.map((x) => x.message)].join(' ')}</span>
            ),
          },
        ]}
      />
      <div className="grid gap-4 lg:grid-cols-2 2xl:grid-cols-3">
        {cards.map((fit) => {
          const pair = pairs.find((p) => p.tonic.id === fit.id);
          return (
            <article key={fit.id} className="gw-card p-4" aria-labelledby={`fit-${fit.id}`}>
              <header className="flex items-baseline justify-between gap-2">
                <h3 id={`fit-${fit.id}`} className="font-semibold">
                  <span className="font-mono">{fit.compound}</span> · {fit.target}
                  {twoReadouts && !pair ? ` · ${readoutText(fit)}` : ''}
                </h3>
                <span
                  className={`text-xs font-semibold ${fit.status === 'fitted' ? 'text-signal-pass' : fit.status === 'not_converged' ? 'text-signal-fail' : 'text-signal-warn'}`}
                >
                  {STATUS_TEXT[fit.status]}
                </span>
              </header>
              <DoseResponsePlot
                id={`plot-${fit.id}`}
                fit={fit}
                points={wellsOf(fit)}
                useDependent={
                  pair ? { fit: pair.useDependent, points: wellsOf(pair.useDependent) } : undefined
                }
              />
              <div className="mb-2 flex justify-end">
                <SvgDownloadButton
                  targetId={`plot-${fit.id}`}
                  filename={`${fit.compound}-${fit.target}-dose-response.svg`.replace(/[^\w.-]+/g, '_')}
                  label={`Download SVG of ${fit.compound} on ${fit.target}`}
                />
              </div>
              <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-sm">
                <dt className="text-ink-500">{pair ? `IC50, ${readoutText(fit)}` : 'IC50'}</dt>
                <dd className="tabular-nums">{ic50Text(fit)}</dd>
                {pair ? (
                  <>
                    <dt className="text-ink-500">IC50, {readoutText(pair.useDependent)}</dt>
                    <dd className="tabular-nums">{ic50Text(pair.useDependent)}</dd>
                    <dt className="text-ink-500">Tonic ÷ use-dependent</dt>
                    <dd className="tabular-nums">{ratioText(pair)}</dd>
                  </>
                ) : null}
                <dt className="text-ink-500">Hill slope</dt>
                <dd className="tabular-nums">{num(fit.hill)}</dd>
                {fit.model === 'hill4' ? (
                  <>
                    <dt className="text-ink-500">Bottom / top</dt>
                    <dd className="tabular-nums">
                      {num(fit.bottom)} / {num(fit.top)}
                    </dd>
                  </>
                ) : null}
                <dt className="text-ink-500">R² · residual SD</dt>
                <dd className="tabular-nums">
                  {num(fit.r2)} · {num(fit.residualSd, 2)}
                </dd>
                <dt className="text-ink-500">Wells used</dt>
                <dd className="tabular-nums">{fit.n}</dd>
              </dl>
              <p className="mt-2 text-xs text-ink-700">{fit.message}</p>
              {fit.flags.map((f) => (
                <p key={f.code} className="text-xs text-signal-warn">
                  {f.message}
                </p>
              ))}
              <fieldset className="mt-3 flex items-center gap-3 text-sm" disabled={!editable}>
                <legend className="sr-only">
                  Model for {fit.compound} on {fit.target}
                </legend>
                {(['hill2', 'hill4'] as const).map((model) => (
                  <label key={model} className="inline-flex items-center gap-1">
                    <input
                      type="radio"
                      name={`model-${fit.id}`}
                      checked={fit.model === model}
                      onChange={() => switchModel(fit, model)}
                    />
                    {model === 'hill2' ? '2 parameters (bottom 0, top 1)' : '4 parameters'}
                  </label>
                ))}
              </fieldset>
            </article>
          );
        })}
      </div>
    </div>
  );
}
