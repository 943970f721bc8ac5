import { Field } from '@/components/forms/field';
import { SelectField } from '@/components/forms/select-field';
import { SuggestingField } from '@/components/forms/suggesting-field';
import { AppLink } from '@/components/ui/app-link';
import { eventKindLabel, objectKindLabel } from '@/lib/audit/field-labels';
import type { AUDIT_FILTER_KEYS } from '@/lib/validation/audit';

export type FilterValues = Partial<Record<(typeof AUDIT_FILTER_KEYS)[number], string>>;
type Errors = Partial<Record<string, string[]>>;

const byLabel = (a: { label: string }, b: { label: string }) => a.label.localeCompare(b.label, 'en-GB');

/** The audit trail's filters as a plain GET form, so every filtered view has its own address. */
export function AuditFilterForm({
  values,
  errors,
  timeZone,
  choices,
}: {
  values: FilterValues;
  errors: Errors;
  timeZone: string;
  choices: {
    entityTypes: string[];
    actions: string[];
    people: { id: string; label: string }[];
  };
}) {
  return (
    <form
      method="get"
      action="/audit"
      className="gw-card mb-4 grid gap-x-4 gap-y-1 p-4 sm:grid-cols-2 lg:grid-cols-4"
      role="search"
      aria-label="Filter the audit trail"
    >
      <SelectField
        label="Person"
        name="userId"
        id="filter-userId"
        defaultValue={values.userId ?? ''}
        errors={errors.userId}
        options={[
          { value: '', label: 'Anyone' },
          ...choices.people.map((person) => ({ value: person.id, label: person.label })),
        ]}
      />
      <SelectField
        label="What happened"
        name="action"
        id="filter-action"
        defaultValue={values.action ?? ''}
        errors={errors.action}
        options={[
          { value: '', label: 'Anything' },
          ...choices.actions
            .map((action) => ({ value: action, label: eventKindLabel(action) }))
            .sort(byLabel),
        ]}
      />
      <SuggestingField
        label="Plate"
        name="plate"
        id="filter-plate"
        listId="filter-plate-labels"
        source="/api/audit/suggestions?kind=plate"
        hint="Its label; every plate of that label, wells included"
        defaultValue={values.plate}
        errors={errors.plate}
      />
      <SuggestingField
        label="Compound"
        name="compound"
        id="filter-compound"
        listId="filter-compound-identifiers"
        source="/api/audit/suggestions?kind=compound"
        hint="Its identifier; its batches and aliases included"
        defaultValue={values.compound}
        errors={errors.compound}
      />
      <SelectField
        label="Kind of object"
        name="entityType"
        id="filter-entityType"
        defaultValue={values.entityType ?? ''}
        errors={errors.entityType}
        options={[
          { value: '', label: 'Any' },
          ...choices.entityTypes.map((type) => ({ value: type, label: objectKindLabel(type) })).sort(byLabel),
        ]}
      />
      <Field
        label={`From (${timeZone})`}
        name="from"
        id="filter-from"
        type="datetime-local"
        defaultValue={values.from}
        errors={errors.from}
      />
      <Field
        label={`To (${timeZone})`}
        name="to"
        id="filter-to"
        type="datetime-local"
        defaultValue={values.to}
        errors={errors.to}
      />
      {values.entityId ? <input type="hidden" name="entityId" value={values.entityId} /> : null}
      <div className="flex items-start gap-2 pt-6">
        <button type="submit" className="gw-button">
          Filter
        </button>
        <AppLink href="/audit" className="gw-button-quiet">
          Clear
        </AppLink>
      </div>
      {errors.entityId ? (
        <p role="alert" className="text-xs text-signal-fail sm:col-span-2 lg:col-span-4">
          {errors.entityId.join(' ')}
        </p>
      ) : null}
    </form>
  );
}
