'use client';

import type {
  ColDef,
  ColumnMovedEvent,
  ColumnResizedEvent,
  ColumnState,
  GridApi,
  GridReadyEvent,
} from 'ag-grid-community';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import {
  GRID_COLUMNS,
  fitLayoutToGrid,
  type GridColumnChoice,
  type GridName,
} from '@/lib/domain/grid-layouts';

/** How long after the last change a layout is sent: one save for a drag, not one per step. */
const SAVE_AFTER_MS = 500;

const url = (grid: GridName) => `/api/grid-layouts/${grid}`;

async function send(grid: GridName, init: RequestInit): Promise<void> {
  const response = await fetch(url(grid), { ...init, headers: { 'content-type': 'application/json' } });
  if (!response.ok) {
    const json = (await response.json().catch(() => ({}))) as { message?: string };
    throw new Error(json.message ?? `The server answered ${response.status}.`);
  }
}

/**
 * A person's own layout of one ag-grid, kept on the server: the grid opens on it (`columns`), changes made
 * by dragging headers or through the columns menu are saved shortly after, and `reset` forgets it and lays
 * the grid out afresh (`gridKey` changes, to remount it).
 */
export function useGridLayout<Row>(grid: GridName, defs: ColDef<Row>[], initial: GridColumnChoice[] | null) {
  const known = GRID_COLUMNS[grid];
  const [layout, setLayout] = useState(() => fitLayoutToGrid(grid, initial ?? []));
  const [own, setOwn] = useState(initial !== null);
  const [status, setStatus] = useState<{ ok: boolean; text: string } | null>(null);
  const [resetting, setResetting] = useState(false);
  const [gridKey, setGridKey] = useState(0);
  const api = useRef<GridApi<Row> | null>(null);
  // Columns whose width the person chose (kept); the others keep the grid's own width, flex included.
  const resized = useRef(new Set((initial ?? []).filter((c) => c.width !== null).map((c) => c.id)));
  const pending = useRef<{ timer: ReturnType<typeof setTimeout>; columns: GridColumnChoice[] } | null>(null);
  // The layout the grid was (re)mounted with: later changes are the grid's own state.
  const [mountedWith, setMountedWith] = useState(layout);

  const save = useCallback(
    (columns: GridColumnChoice[]) => {
      if (pending.current) clearTimeout(pending.current.timer);
      const timer = setTimeout(() => {
        pending.current = null;
        send(grid, { method: 'PUT', body: JSON.stringify({ columns }) })
          .then(() => setStatus({ ok: true, text: 'Column choice saved for you.' }))
          .catch((e: unknown) =>
            setStatus({
              ok: false,
              text: `The column choice could not be saved: ${e instanceof Error ? e.message : 'no answer'}`,
            }),
          );
      }, SAVE_AFTER_MS);
      pending.current = { timer, columns };
    },
    [grid],
  );

  // A change still waiting when the page is left is sent at once (keepalive outlives the page).
  useEffect(
    () => () => {
      const waiting = pending.current;
      if (!waiting) return;
      clearTimeout(waiting.timer);
      void fetch(url(grid), {
        method: 'PUT',
        keepalive: true,
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ columns: waiting.columns }),
      });
    },
    [grid],
  );

  /** The grid's columns as they are now, as a layout. */
  const read = useCallback((): GridColumnChoice[] => {
    const state = api.current?.getColumnState() ?? [];
    return state
      .filter((c) => known.includes(c.colId))
      .map((c) => ({
        id: c.colId,
        hidden: Boolean(c.hide),
        width: resized.current.has(c.colId) && c.width ? Math.round(c.width) : null,
      }));
  }, [known]);

  const changed = useCallback(() => {
    const columns = read();
    setLayout(columns);
    setOwn(true);
    save(columns);
  }, [read, save]);

  const columns = useMemo(() => {
    const byId = new Map(defs.map((d) => [d.colId!, d]));
    return mountedWith.flatMap((choice) => {
      const def = byId.get(choice.id);
      if (!def) return [];
      // Initial attributes only: were ag-grid given its column definitions again, it would apply hide,
      // width and flex again and undo what the person did since (as it would the order, but for
      // maintainColumnOrder below).
      const { hide: _hide, width, flex, ...rest } = def;
      return [
        {
          ...rest,
          initialHide: choice.hidden,
          initialWidth: choice.width ?? width,
          initialFlex: choice.width !== null ? undefined : (flex ?? undefined),
        },
      ];
    });
  }, [defs, mountedWith]);

  const gridEvents = {
    // Should the grid ever be given its column definitions again, it keeps the order the person chose.
    maintainColumnOrder: true,
    onGridReady: (e: GridReadyEvent<Row>) => {
      api.current = e.api;
    },
    // Only what the person does in the grid (a header dragged or its edge); the menu saves its own.
    onColumnMoved: (e: ColumnMovedEvent<Row>) => {
      if (e.finished && e.source === 'uiColumnMoved') changed();
    },
    onColumnResized: (e: ColumnResizedEvent<Row>) => {
      if (!e.finished || e.source !== 'uiColumnResized') return;
      for (const column of e.columns ?? []) resized.current.add(column.getColId());
      changed();
    },
  };

  const show = (id: string, shown: boolean) => {
    api.current?.setColumnsVisible([id], shown);
    changed();
  };

  const move = (id: string, by: -1 | 1) => {
    const state = api.current?.getColumnState();
    if (!state) return;
    const others = state.filter((c) => !known.includes(c.colId));
    const managed: ColumnState[] = state.filter((c) => known.includes(c.colId));
    const from = managed.findIndex((c) => c.colId === id);
    const to = from + by;
    // The pinned well column stays first.
    if (from < 0 || to < 0 || to >= managed.length || managed[to]!.pinned) return;
    [managed[from], managed[to]] = [managed[to]!, managed[from]!];
    api.current!.applyColumnState({ state: [...others, ...managed], applyOrder: true });
    changed();
  };

  const reset = async () => {
    if (pending.current) clearTimeout(pending.current.timer);
    pending.current = null;
    setResetting(true);
    try {
      await send(grid, { method: 'DELETE' });
      const fresh = fitLayoutToGrid(grid, []);
      resized.current = new Set();
      setMountedWith(fresh);
      setLayout(fresh);
      setOwn(false);
      setGridKey((k) => k + 1);
      setStatus({ ok: true, text: 'Columns reset to the grid’s own.' });
    } catch (e) {
      setStatus({
        ok: false,
        text: `The columns could not be reset: ${e instanceof Error ? e.message : 'no answer'}`,
      });
    } finally {
      setResetting(false);
    }
  };

  return { layout, own, status, resetting, gridKey, columns, gridEvents, show, move, reset };
}
