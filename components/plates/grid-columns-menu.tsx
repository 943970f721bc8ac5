'use client';

import type { GridColumnChoice } from '@/lib/domain/grid-layouts';
import { BusyButton } from '@/components/ui/busy-button';

/**
 * The wells grid's column choice: show or hide each column and move it earlier or later (widths by
 * dragging a header's edge, order also by dragging a header). The choice is kept for the person on the
 * server; "Reset columns" goes back to the grid's own.
 */
export function GridColumnsMenu({
  layout,
  names,
  alwaysShown,
  own,
  status,
  resetting,
  onShow,
  onMove,
  onReset,
}: {
  layout: GridColumnChoice[];
  /** Each column's header, by id. */
  names: Record<string, string>;
  alwaysShown: readonly string[];
  /** Whether the person has a choice of their own kept (else the grid's own layout). */
  own: boolean;
  status: { ok: boolean; text: string } | null;
  resetting: boolean;
  onShow: (id: string, shown: boolean) => void;
  onMove: (id: string, by: -1 | 1) => void;
  onReset: () => void;
}) {
  const movable = layout.filter((c) => !alwaysShown.includes(c.id));
  const shown = layout.filter((c) => !c.hidden).length;
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm">
      <details className="relative">
        <summary className="gw-button-quiet cursor-pointer list-none">
          Columns ({shown} of {layout.length} shown)
        </summary>
        <div
          role="group"
          aria-label="Columns of the wells grid"
          className="gw-card absolute left-0 z-20 mt-1 w-80 space-y-1 p-3 shadow-lg"
        >
          <p className="pb-1 text-xs text-ink-500">
            Tick the columns to show. Drag a header to move it, or its edge to widen it.
          </p>
          <ul className="space-y-1">
            {layout.map((column) => {
              const name = names[column.id] ?? column.id;
              const fixed = alwaysShown.includes(column.id);
              const index = movable.findIndex((c) => c.id === column.id);
              return (
                <li key={column.id} className="flex items-center gap-2">
                  <label className="inline-flex flex-1 items-center gap-2">
                    <input
                      type="checkbox"
                      checked={!column.hidden}
                      disabled={fixed}
                      onChange={(e) => onShow(column.id, e.target.checked)}
                    />
                    {name}
                    {fixed ? <span className="text-xs text-ink-500">(always shown)</span> : null}
                  </label>
                  {fixed ? null : (
                    <>
                      <button
                        type="button"
                        className="rounded px-1 text-ink-700 hover:bg-ink-100 disabled:opacity-30"
                        aria-label={`Move ${name} earlier`}
                        title="Move earlier"
                        disabled={index <= 0}
                        onClick={() => onMove(column.id, -1)}
                      >
                        ↑
                      </button>
                      <button
                        type="button"
                        className="rounded px-1 text-ink-700 hover:bg-ink-100 disabled:opacity-30"
                        aria-label={`Move ${name} later`}
                        title="Move later"
                        disabled={index === movable.length - 1}
                        onClick={() => onMove(column.id, 1)}
                      >
                        ↓
                      </button>
                    </>
                  )}
                </li>
              );
            })}
          </ul>
        </div>
      </details>
      <span className="text-ink-700">{own ? 'Your own column choice' : 'The grid’s own columns'}</span>
      {own ? (
        <BusyButton className="gw-button-quiet" busy={resetting} busyLabel="Resetting…" onClick={onReset}>
          Reset columns
        </BusyButton>
      ) : null}
      <p
        role="status"
        aria-live="polite"
        className={status?.ok === false ? 'text-signal-fail' : 'text-ink-500'}
      >
        {status?.text}
      </p>
    </div>
  );
}
