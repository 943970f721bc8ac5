import { Field } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import { AppLink } from '@/components/ui/app-link';

export type FilterValues = Partial<Record<'entityType' | 'entityId' | 'userId' | 'from' | 'to', string>>;
type Errors = Partial<Record<string, string[]>>;

/** The audit trail's filters as a plain GET form, so every filtered view has its own address. */
export function AuditFilterForm({
  values,
  errors,
  entityTypes,
  people,
}: {
  values: FilterValues;
  errors: Errors;
  entityTypes: string[];
  people: { id: string; label: string }[];
}) {
  return (
    <form
      method="get"
      action="/audit"
      className="gw-card mb-4 grid gap-x-4 gap-y-1 p-4 sm:grid-cols-2 xl:grid-cols-[repeat(5,minmax(0,1fr))_auto]"
      role="search"
      aria-label="Filter the audit trail"
    >
      <SelectField
        label="Record type"
        name="entityType"
        id="filter-entityType"
        defaultValue={values.entityType ?? ''}
        errors={errors.entityType}
        options={[{ value: '', label: 'Any' }, ...entityTypes.map((type) => ({ value: type, label: type }))]}
      />
      <Field
        label="Record id"
        name="entityId"
        id="filter-entityId"
        defaultValue={values.entityId}
        className="gw-input mt-1 font-mono"
        errors={errors.entityId}
      />
      <SelectField
        label="Person"
        name="userId"
        id="filter-userId"
        defaultValue={values.userId ?? ''}
        errors={errors.userId}
        options={[
          { value: '', label: 'Anyone' },
          ...people.map((person) => ({ value: person.id, label: person.label })),
        ]}
      />
      <Field
        label="From (UTC)"
        name="from"
        id="filter-from"
        type="datetime-local"
        defaultValue={values.from}
        errors={errors.from}
      />
      <Field
        label="To (UTC)"
        name="to"
        id="filter-to"
        type="datetime-local"
        defaultValue={values.to}
        errors={errors.to}
      />
      <div className="flex items-start gap-2 pt-6">
        <button type="submit" className="gw-button">
          Filter
        </button>
        <AppLink href="/audit" className="gw-button-quiet">
          Clear
        </AppLink>
      </div>
    </form>
  );
}
