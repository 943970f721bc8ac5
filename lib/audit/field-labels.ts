// Pure and client-safe: the one table of words the audit trail uses for what audit events record.
// Kinds of object, kinds of event and fields each get a human label (with units); anything not listed
// falls back to a readable form of its name, never camelCase.

/** Kinds of object (audit_events.entity_type) in words. */
export const OBJECT_KIND_LABELS: Record<string, string> = {
  plate: 'Plate',
  well: 'Well',
  compound: 'Compound',
  batch: 'Batch',
  compound_alias: 'Compound alias',
  screen: 'Screen',
  target: 'Target',
  target_alias: 'Target alias',
  import_template: 'Import template',
  import_draft: 'Import in progress',
  user: 'Person',
  session: 'Sign-in',
  mail_message: 'E-mail',
  mail_outbox: 'E-mail outbox',
  audit_trail: 'Audit trail',
};

/** Kinds of event (audit_events.action) in words. */
export const EVENT_KIND_LABELS: Record<string, string> = {
  create: 'Created',
  update: 'Changed',
  delete: 'Removed',
  import: 'Imported',
  export: 'Downloaded',
  sign: 'Signed',
  verify: 'Verified',
  submit: 'Submitted for approval',
  approve: 'Approved',
  reject: 'Returned',
  rework: 'Sent back for rework',
  exclude_well: 'Well excluded',
  include_well: 'Well included again',
  change_fit_model: 'Fit model changed',
  wait: 'Import waiting for compounds',
  discard: 'Import discarded',
  sign_in: 'Signed in',
  sign_in_failed: 'Sign-in failed',
  sign_in_throttled: 'Sign-in slowed down',
  sign_out: 'Signed out',
  change_password: 'Password changed',
  reset_password: 'Password reset by an administrator',
  password_link_requested: 'Password link asked for',
  password_link_throttled: 'Password link slowed down',
  set_password_by_link: 'Password set by link',
  change_roles: 'Roles changed',
  disable: 'Account disabled',
  enable: 'Account enabled',
  hurry_mail: 'E-mail sent at once',
  requeue_mail: 'E-mail queued again',
};

/** A field's label and, where it has one, its unit. */
export interface FieldLabel {
  label: string;
  unit?: string;
}

/** Fields of audit events' before and after values in words, with units. */
export const FIELD_LABELS: Record<string, FieldLabel> = {
  // people and sessions
  email: { label: 'E-mail' },
  name: { label: 'Name' },
  roles: { label: 'Roles' },
  enabled: { label: 'Account enabled' },
  passwordChangedAt: { label: 'Password changed at' },
  newPassword: { label: 'New password' },
  sent: { label: 'Link sent' },
  why: { label: 'Why not sent' },
  noticeDelivery: { label: 'Notices by' },
  // plates, wells, fits
  label: { label: 'Plate label' },
  screenId: { label: 'Screen' },
  plateId: { label: 'Plate' },
  supersedesPlateId: { label: 'Replaces plate' },
  format: { label: 'Format' },
  filename: { label: 'File' },
  wells: { label: 'Wells' },
  readouts: { label: 'Readouts' },
  position: { label: 'Well' },
  excluded: { label: 'Excluded' },
  exclusionReason: { label: 'Reason for exclusion' },
  compoundId: { label: 'Compound' },
  targetId: { label: 'Target' },
  target: { label: 'Target' },
  model: { label: 'Fit model' },
  status: { label: 'Fit status' },
  ic50_uM: { label: 'IC50', unit: 'µM' },
  state: { label: 'State' },
  version: { label: 'Version' },
  meaning: { label: 'Meaning of the signature' },
  comment: { label: 'Comment' },
  qcWarningsAcknowledged: { label: 'QC warnings acknowledged' },
  waitingFor: { label: 'Waiting for compounds' },
  // compounds
  identifier: { label: 'Compound identifier' },
  compoundIdentifier: { label: 'Compound' },
  smiles: { label: 'SMILES' },
  molecularWeight: { label: 'Molecular weight', unit: 'g/mol' },
  lot: { label: 'Lot' },
  purity_percent: { label: 'Purity', unit: '%' },
  stockConcentration_mM: { label: 'Stock concentration', unit: 'mM' },
  solvent: { label: 'Solvent' },
  alias: { label: 'Alias' },
  // screens and targets
  description: { label: 'Description' },
  neuronPreset: { label: 'Neuron model' },
  zPrimeMin: { label: 'Lowest Z′' },
  sealResistanceMin_GOhm: { label: 'Lowest seal resistance', unit: 'GΩ' },
  controlCurrentMin_pA: { label: 'Lowest control current', unit: 'pA' },
  seriesResistanceMax_MOhm: { label: 'Highest series resistance', unit: 'MΩ' },
  capacitanceMin_pF: { label: 'Lowest capacitance', unit: 'pF' },
  capacitanceMax_pF: { label: 'Highest capacitance', unit: 'pF' },
  vehicleRundownMax_fraction: { label: 'Highest vehicle rundown', unit: 'fraction' },
  normaliseToReference: { label: 'Normalise to the reference' },
  exposures_uM: { label: 'Exposures', unit: 'µM' },
  conductance: { label: 'Conductance' },
  mapping: { label: 'Column mapping' },
  // downloads and mail
  file: { label: 'File' },
  rows: { label: 'Rows' },
  filter: { label: 'Filter' },
  toAddress: { label: 'To' },
};

/**
 * Fields people do not read: internal references and fingerprints. The page leaves them out; the export
 * keeps every value as recorded.
 */
export const INTERNAL_FIELDS = new Set([
  'id',
  'createdBy',
  'sessionVersion',
  'linkId',
  'signatureId',
  'signoffEventId',
  'fitJobId',
  'draftId',
  'messages',
  'sha256',
  'contentSha256',
  'fingerprint',
]);

/** Fields whose value is the id of a plate, compound, screen, target or person: shown by its name. */
export const REFERENCE_FIELDS = new Set([
  'screenId',
  'plateId',
  'supersedesPlateId',
  'compoundId',
  'targetId',
]);

const UNIT_WORDS: Record<string, string> = {
  uM: 'µM',
  mM: 'mM',
  nM: 'nM',
  pA: 'pA',
  pF: 'pF',
  GOhm: 'GΩ',
  MOhm: 'MΩ',
  ms: 'ms',
  mV: 'mV',
  percent: '%',
  fraction: 'fraction',
};

/** A field name as words: `sealResistance_GOhm` → `Seal resistance (GΩ)`, `exclusion_reason` → `Exclusion reason`. */
export function readableName(key: string): string {
  const unitMatch = /_([A-Za-z]+)$/.exec(key);
  const unit = unitMatch && UNIT_WORDS[unitMatch[1]!];
  const stem = unit ? key.slice(0, unitMatch!.index) : key;
  const words = stem
    .replace(/_/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .trim()
    .toLowerCase()
    .replace(/\bid\b$/, '')
    .trim();
  const sentence = words ? words.charAt(0).toUpperCase() + words.slice(1) : key;
  return unit ? `${sentence} (${unit})` : sentence;
}

/** A field's label with its unit, for a heading or a change line. */
export function fieldLabel(key: string): string {
  const known = FIELD_LABELS[key];
  if (!known) return readableName(key);
  return known.unit ? `${known.label} (${known.unit})` : known.label;
}

const readableWords = (value: string) => {
  const words = value.replace(/_/g, ' ').trim();
  return words ? words.charAt(0).toUpperCase() + words.slice(1) : value;
};

/** A kind of object in words. */
export const objectKindLabel = (kind: string) => OBJECT_KIND_LABELS[kind] ?? readableWords(kind);

/** A kind of event in words. */
export const eventKindLabel = (kind: string) => EVENT_KIND_LABELS[kind] ?? readableWords(kind);

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const LONG_HEX = /^[0-9a-f]{24,}$/i;

/** Names of the records an event's values refer to, by id (looked up for a whole page at once). */
export type NameLookup = Record<string, string>;

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/** One value as a person reads it: names for ids, yes/no, lists joined; ids with no name are not shown. */
export function showValue(value: unknown, names: NameLookup = {}): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '—';
  if (typeof value === 'string') {
    if (UUID.test(value)) return names[value.toLowerCase()] ?? 'a record no longer known';
    if (LONG_HEX.test(value)) return 'fingerprint recorded';
    return value;
  }
  if (Array.isArray(value)) return value.length ? value.map((v) => showValue(v, names)).join(', ') : 'none';
  if (isRecord(value)) {
    const parts = Object.keys(value)
      .filter((key) => !INTERNAL_FIELDS.has(key))
      .map((key) => `${fieldLabel(key)} ${showValue(value[key], names)}`);
    return parts.length ? parts.join(', ') : 'recorded';
  }
  return String(value);
}

/** One field's change: its label and its value before and after (`—` where it had none). */
export interface FieldChange {
  field: string;
  before: string | null;
  after: string | null;
}

/** No value at all: a field missing, null or empty reads the same to a person ("—"). */
const nothing = (value: unknown) => value === null || value === undefined || value === '';

/** Unchanged for a reader: equal values, or nothing before and nothing after (missing vs empty is no change). */
const same = (a: unknown, b: unknown) =>
  (nothing(a) && nothing(b)) || JSON.stringify(a) === JSON.stringify(b);

/**
 * What an event changed, field by field, in words: a creation lists what was set (before null), a
 * removal what was there (after null), a change only the fields that differ (missing and empty count as
 * the same, and a field the after-record lacks as not recorded). Internal references and
 * fingerprints are left out. A value that is not an object becomes one line labelled "Value".
 */
export function fieldChanges(before: unknown, after: unknown, names: NameLookup = {}): FieldChange[] {
  const b = isRecord(before) ? before : before === null || before === undefined ? {} : { value: before };
  const a = isRecord(after) ? after : after === null || after === undefined ? {} : { value: after };
  const hasBefore = before !== null && before !== undefined;
  const hasAfter = after !== null && after !== undefined;
  const keys = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter(
    (key) => !INTERNAL_FIELDS.has(key),
  );
  return (
    keys
      // On a change, a field the after-record does not hold was not recorded, not removed: left out.
      .filter((key) => !(hasBefore && hasAfter && (same(b[key], a[key]) || !(key in a))))
      .map((key) => ({
        field: fieldLabel(key),
        before: hasBefore ? showValue(b[key], names) : null,
        after: hasAfter ? showValue(a[key], names) : null,
      }))
  );
}

/** One change as a line: `Field: before → after`, `Field: after` (set) or `Field: before → removed`. */
export function changeLine(change: FieldChange): string {
  if (change.before === null) return `${change.field}: ${change.after ?? '—'}`;
  if (change.after === null) return `${change.field}: ${change.before} → removed`;
  return `${change.field}: ${change.before} → ${change.after}`;
}

/** Every change of an event as one text (for a cell of the export), or "no field changed". */
export function changeText(before: unknown, after: unknown, names: NameLookup = {}): string {
  const changes = fieldChanges(before, after, names);
  if (!changes.length) return before === null && after === null ? '—' : 'no field changed';
  return changes.map(changeLine).join('; ');
}
