import { AppLink } from '@/components/ui/app-link';
import { PLATE_STATE_LABEL, PLATE_STATES } from '@/lib/domain/plate-states';
import type { PlateFilterParams } from '@/lib/validation/plate-filter';

/** Filters of the plates list as a plain GET form, so every filtered view has its own address. */
export function PlateFilters({
  filter,
  screens,
  importers,
}: {
  filter: PlateFilterParams;
  screens: { id: string; name: string }[];
  importers: { id: string; name: string }[];
}) {
  return (
    <form
      method="get"
      className="gw-card mb-4 grid gap-3 p-4 sm:grid-cols-3 lg:grid-cols-6"
      aria-label="Filter plates"
    >
      <div>
        <label htmlFor="f-screen" className="gw-label">
          Screen
        </label>
        <select id="f-screen" name="screen" defaultValue={filter.screen ?? ''} className="gw-input mt-1">
          <option value="">All screens</option>
          {screens.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="f-state" className="gw-label">
          State
        </label>
        <select id="f-state" name="state" defaultValue={filter.state ?? ''} className="gw-input mt-1">
          <option value="">Any state</option>
          {PLATE_STATES.map((s) => (
            <option key={s} value={s}>
              {PLATE_STATE_LABEL[s]}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="f-importer" className="gw-label">
          Imported by
        </label>
        <select
          id="f-importer"
          name="importer"
          defaultValue={filter.importer ?? ''}
          className="gw-input mt-1"
        >
          <option value="">Anyone</option>
          {importers.map((u) => (
            <option key={u.id} value={u.id}>
              {u.name}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="f-from" className="gw-label">
          From (UTC)
        </label>
        <input
          id="f-from"
          name="from"
          type="date"
          defaultValue={filter.from ?? ''}
          className="gw-input mt-1"
        />
      </div>
      <div>
        <label htmlFor="f-to" className="gw-label">
          To (UTC)
        </label>
        <input id="f-to" name="to" type="date" defaultValue={filter.to ?? ''} className="gw-input mt-1" />
      </div>
      <div className="flex items-end gap-2">
        <button type="submit" className="gw-button">
          Filter
        </button>
        <AppLink href="/plates" className="gw-button-quiet">
          Clear
        </AppLink>
      </div>
    </form>
  );
}
