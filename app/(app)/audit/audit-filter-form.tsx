import { AppLink } from '@/components/ui/app-link';

export type FilterValues = Partial<Record<'entityType' | 'entityId' | 'userId' | 'from' | 'to', string>>;
type Errors = Partial<Record<string, string[]>>;

function Error({ id, messages }: { id: string; messages: string[] | undefined }) {
  return <p id={id} aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">{messages?.join(' ')}</p>;
}

/** The audit trail's filters as a plain GET form, so every filtered view has its own address. */
export function AuditFilterForm({ values, errors, entityTypes, people }: {
  values: FilterValues;
  errors: Errors;
  entityTypes: string[];
  people: { id: string; label: string }[];
}) {
  const described = (name: string) => ({ 'aria-describedby': `filter-${name}-error`, 'aria-invalid': errors[name]?.length ? true : undefined });
  return (
    <form method="get" action="/audit" className="gw-card mb-4 grid gap-x-4 gap-y-1 p-4 sm:grid-cols-2 xl:grid-cols-[repeat(5,minmax(0,1fr))_auto]" role="search" aria-label="Filter the audit trail">
      <div>
        <label htmlFor="filter-entityType" className="gw-label">Record type</label>
        <select id="filter-entityType" name="entityType" defaultValue={values.entityType ?? ''} className="gw-input mt-1" {...described('entityType')}>
          <option value="">Any</option>
          {entityTypes.map((type) => <option key={type} value={type}>{type}</option>)}
        </select>
        <Error id="filter-entityType-error" messages={errors.entityType} />
      </div>
      <div>
        <label htmlFor="filter-entityId" className="gw-label">Record id</label>
        <input id="filter-entityId" name="entityId" defaultValue={values.entityId} className="gw-input mt-1 font-mono" {...described('entityId')} />
        <Error id="filter-entityId-error" messages={errors.entityId} />
      </div>
      <div>
        <label htmlFor="filter-userId" className="gw-label">Person</label>
        <select id="filter-userId" name="userId" defaultValue={values.userId ?? ''} className="gw-input mt-1" {...described('userId')}>
          <option value="">Anyone</option>
          {people.map((person) => <option key={person.id} value={person.id}>{person.label}</option>)}
        </select>
        <Error id="filter-userId-error" messages={errors.userId} />
      </div>
      <div>
        <label htmlFor="filter-from" className="gw-label">From (UTC)</label>
        <input id="filter-from" name="from" type="datetime-local" defaultValue={values.from} className="gw-input mt-1" {...described('from')} />
        <Error id="filter-from-error" messages={errors.from} />
      </div>
      <div>
        <label htmlFor="filter-to" className="gw-label">To (UTC)</label>
        <input id="filter-to" name="to" type="datetime-local" defaultValue={values.to} className="gw-input mt-1" {...described('to')} />
        <Error id="filter-to-error" messages={errors.to} />
      </div>
      <div className="flex items-start gap-2 pt-6">
        <button type="submit" className="gw-button">Filter</button>
        <AppLink href="/audit" className="gw-button-quiet">Clear</AppLink>
      </div>
    </form>
  );
}
