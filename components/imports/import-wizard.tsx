'use client';

import { AppLink } from '@/components/ui/app-link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { PLATE_FACT_LABEL, type PlateFact } from '@/lib/imports/import-fields';
import { columnMappingDraftSchema, type ColumnMapping } from '@/lib/imports/mapping-schema';
import { emptyFileMessage } from '@/lib/imports/upload-messages';
import {
  commitWithProgress,
  inspectWithProgress,
  postImportStep,
  type Inspection,
  type Preview,
  type WorkProgress,
} from './import-api';
import { ImportProgress } from './import-progress';
import { LayoutChoice, tableOf } from './layout-choice';
import { MappingStep } from './mapping-step';
import { PlateFactsForm } from './plate-facts-form';
import { PlatesInFile, PlateSplitChoice, StoredPlates } from './plates-in-file';
import { PreviewStep } from './preview-step';
import { UnknownCompoundsPanel } from './unknown-compounds';
import { ValueMaps } from './value-maps';
import { BusyButton } from '@/components/ui/busy-button';

export interface WizardScreen {
  id: string;
  name: string;
  targets: string[];
}
export interface WizardTemplate {
  id: string;
  name: string;
  mapping: unknown;
}

const STEPS = ['Choose the file', 'Map the columns', 'Check and store'] as const;

/** An import that waited for compounds, resumed by its owner: its draft's sheets and the choices kept. */
export interface ResumedImport {
  draftId: string;
  screenId: string;
  filename: string;
  sheets: Inspection['sheets'];
  choice: {
    sheet: string;
    mapping: ColumnMapping;
    format?: number | undefined;
    label: string;
    labels?: Record<string, string> | undefined;
  };
  targetAliases: Inspection['targetAliases'];
}

/** The three import steps: read the file, map its columns, check every row and store the plate. */
export function ImportWizard({
  screens,
  templates: initialTemplates,
  canRegisterCompounds = false,
  resume,
}: {
  screens: WizardScreen[];
  templates: WizardTemplate[];
  /** Whether the person may register compounds from the check step (capability registerCompounds). */
  canRegisterCompounds?: boolean;
  /** A waiting import to resume at the mapping step, with its sheet, mapping and label. */
  resume?: ResumedImport;
}) {
  const router = useRouter();
  const [step, setStep] = useState(resume ? 1 : 0);
  const [screenId, setScreenId] = useState(resume?.screenId ?? screens[0]?.id ?? '');
  const [file, setFile] = useState<File | null>(null);
  const [inspection, setInspection] = useState<Inspection | null>(
    resume
      ? {
          draftId: resume.draftId,
          expiresAt: null,
          sha256: '',
          duplicateOf: null,
          sheets: resume.sheets,
          recognised: null,
          targetAliases: resume.targetAliases,
        }
      : null,
  );
  const [sheet, setSheet] = useState(resume?.choice.sheet ?? '');
  const [mapping, setMapping] = useState<ColumnMapping | null>(resume?.choice.mapping ?? null);
  const [format, setFormat] = useState(resume?.choice.format ? String(resume.choice.format) : '');
  const [preview, setPreview] = useState<Preview | null>(null);
  const [label, setLabel] = useState(resume?.choice.label ?? '');
  const [templateName, setTemplateName] = useState('');
  const [deleting, setDeleting] = useState(false);
  const [busy, setBusy] = useState(false);
  /** The stage of the work under way (upload, reading, checking, the import job's stages). */
  const [progress, setProgress] = useState<WorkProgress | null>(null);
  /** Set once the plate is stored and its page is opening: nothing more to start here. */
  const [leaving, setLeaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  /** Set when the server answered that a worker is still storing the plate (202). */
  const [storing, setStoring] = useState<string | null>(null);
  // Value maps, plate facts and recognised layouts (issue 18).
  const [templates, setTemplates] = useState(initialTemplates);
  const [templateId, setTemplateId] = useState('');
  const [recognised, setRecognised] = useState<string | null>(null);
  const [labelTouched, setLabelTouched] = useState(false);
  // A file of several plates (issue 18): each plate's label by its key, and the plates once stored.
  const [labels, setLabels] = useState<Record<string, string>>(resume?.choice.labels ?? {});
  const [stored, setStored] = useState<{ plateId: string; label: string; href: string }[] | null>(null);

  async function run<T>(work: () => Promise<T>): Promise<T | null> {
    setBusy(true);
    setError(null);
    try {
      return await work();
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The request failed.');
      return null;
    } finally {
      setBusy(false);
      setProgress(null);
    }
  }

  const chooseSheet = (result: Inspection, name: string) => {
    const found = result.sheets.find((s) => s.name === name) ?? result.sheets[0]!;
    setSheet(found.name);
    setMapping(found.guess.mapping);
    return found;
  };

  const applyTemplate = (id: string) => {
    setTemplateId(id);
    const t = templates.find((x) => x.id === id);
    if (!t) return;
    const next = columnMappingDraftSchema.parse(t.mapping);
    const named = inspection?.sheets.find((s) => s.name === next.wellSheet);
    if (named) setSheet(named.name);
    setMapping(next);
    setTemplateName(t.name);
  };

  async function deleteTemplate() {
    const t = templates.find((x) => x.id === templateId);
    if (!t || !window.confirm(`Delete the template “${t.name}”? Plates imported with it keep their data.`))
      return;
    setDeleting(true);
    const ok = await run(async () => {
      const response = await fetch(`/api/import-templates/${t.id}`, { method: 'DELETE' });
      if (!response.ok) throw new Error(`The template could not be deleted (${response.status}).`);
      return true;
    }).finally(() => setDeleting(false));
    if (!ok) return;
    setTemplates(templates.filter((x) => x.id !== t.id));
    setTemplateId('');
    if (templateName === t.name) setTemplateName('');
  }

  async function inspect() {
    if (!file) return setError('Choose a file first.');
    if (file.size === 0) return setError(emptyFileMessage(file.name));
    const result = await run(() => inspectWithProgress<Inspection>({ screenId }, file, setProgress));
    if (!result) return;
    setInspection(result);
    setLabelTouched(false);
    const fileLabel = file.name.replace(/\.(xlsx|xls|csv)$/i, '');
    if (result.recognised) {
      // A layout mapped before: its template is applied with no click (matched by the header fingerprint).
      setSheet(result.recognised.sheet);
      setMapping(result.recognised.mapping);
      setTemplateId(result.recognised.templateId);
      setTemplateName(result.recognised.name);
      setRecognised(result.recognised.name);
      setLabel(result.recognised.facts.barcode ?? fileLabel);
    } else {
      const best = [...result.sheets].sort((a, b) => b.guess.matched.length - a.guess.matched.length)[0]!;
      const chosen = chooseSheet(result, best.name);
      setTemplateId('');
      setRecognised(null);
      setLabel(chosen.facts.barcode ?? fileLabel);
    }
    if (result.draftId) setStep(1);
  }

  // The file was read once, at inspect; the later steps name the draft the server keeps it in.
  const fields = () => ({
    draftId: inspection?.draftId ?? '',
    sheet,
    mapping: JSON.stringify(mapping),
    format,
  });

  async function check() {
    const result = await run(() => {
      setProgress({ work: 'preview', stage: 'checking' });
      return postImportStep<Preview>('preview', fields());
    });
    if (result) {
      setPreview(result);
      if (result.facts.barcode && !labelTouched) setLabel(result.facts.barcode);
      // Each plate keeps a label typed for it; the others take the file's own (barcode, sheet, column value).
      if (result.plates.length > 1)
        setLabels(Object.fromEntries(result.plates.map((p) => [p.key, labels[p.key] ?? p.label])));
      setStep(2);
    }
  }

  const several = (preview?.plates.length ?? 0) > 1;
  /** The commit's label fields: one label, or each plate's by its key. */
  const labelFields = (): Record<string, string> =>
    several ? { label: preview!.plates[0]!.label, labels: JSON.stringify(labels) } : { label };

  async function store() {
    const result = await run(() =>
      commitWithProgress<{
        href: string;
        plateId?: string;
        message?: string;
        plates?: { plateId: string; label: string; href: string }[];
      }>({ ...fields(), ...labelFields(), templateName }, setProgress),
    );
    if (!result) return;
    if (result.plates && result.plates.length > 1) {
      // Several plates stored: a link to each, here.
      setLeaving(true);
      setStored(result.plates);
    } else if (result.plateId) {
      // Stored: the fits run on a worker now, and the plate's page follows them.
      setLeaving(true);
      setProgress({ work: 'commit', stage: 'fitting' });
      router.push(result.href);
    } else setStoring(result.message ?? 'A worker is still storing this plate.');
  }

  const current = inspection?.sheets.find((s) => s.name === sheet);
  return (
    <div className="space-y-5">
      <ol className="flex flex-wrap gap-2 text-sm" aria-label="Import steps">
        {STEPS.map((name, i) => (
          <li
            key={name}
            aria-current={i === step ? 'step' : undefined}
            className={`rounded-full px-3 py-1 ${i === step ? 'bg-lagoon-700 text-white' : i < step ? 'bg-lagoon-100 text-lagoon-700' : 'bg-ink-100 text-ink-700'}`}
          >
            {i + 1}. {name}
          </li>
        ))}
      </ol>
      <p role="alert" aria-live="assertive" className="min-h-5 text-sm font-medium text-signal-fail">
        {error}
      </p>

      {step === 0 ? (
        <section className="gw-card grid gap-4 p-5 sm:grid-cols-2">
          <div>
            <label htmlFor="import-screen" className="gw-label">
              Screen
            </label>
            <select
              id="import-screen"
              className="gw-input mt-1"
              disabled={busy}
              value={screenId}
              onChange={(e) => {
                setScreenId(e.target.value);
                setInspection(null);
              }}
            >
              {screens.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name} ({s.targets.join(', ') || 'no targets'})
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="import-file" className="gw-label">
              Instrument export (xlsx, xls, ods, csv or tab-separated text, up to 10 MB)
            </label>
            <input
              id="import-file"
              type="file"
              accept=".xlsx,.xls,.ods,.csv,.tsv,.txt,text/csv,text/tab-separated-values"
              className="gw-input mt-1"
              disabled={busy}
              onChange={(e) => {
                const chosen = e.target.files?.[0] ?? null;
                setFile(chosen);
                setInspection(null);
                // A chosen file of 0 bytes is a file, and empty: say so now rather than after the upload.
                setError(chosen && chosen.size === 0 ? emptyFileMessage(chosen.name) : null);
              }}
            />
          </div>
          {inspection?.duplicateOf ? (
            <p
              role="status"
              className="rounded-md border border-amber-200 bg-amber-50 p-3 text-sm text-signal-warn sm:col-span-2"
            >
              This exact file was already imported for this screen as plate{' '}
              <AppLink className="font-semibold underline" href={`/plates/${inspection.duplicateOf.plateId}`}>
                {inspection.duplicateOf.label}
              </AppLink>
              .
            </p>
          ) : null}
          <div className="sm:col-span-2">
            <BusyButton busy={busy} busyLabel="Reading…" disabled={!file || !screenId} onClick={inspect}>
              Read file
            </BusyButton>
            <ImportProgress progress={progress} />
          </div>
        </section>
      ) : null}

      {step === 1 && inspection && mapping && current ? (
        <section className="gw-card space-y-4 p-5">
          <div className="grid gap-4 sm:grid-cols-4">
            <div>
              <label htmlFor="import-sheet" className="gw-label">
                Sheet
              </label>
              <select
                id="import-sheet"
                className="gw-input mt-1"
                value={sheet}
                onChange={(e) => {
                  chooseSheet(inspection, e.target.value);
                  setRecognised(null);
                }}
              >
                {inspection.sheets.map((s) => (
                  <option key={s.name} value={s.name}>
                    {s.name} ({s.rowCount} rows)
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label htmlFor="import-template" className="gw-label">
                Apply a saved template
              </label>
              <select
                id="import-template"
                className="gw-input mt-1"
                value={templateId}
                onChange={(e) => applyTemplate(e.target.value)}
              >
                <option value="">— guessed from the headers —</option>
                {templates.map((t) => (
                  <option key={t.id} value={t.id}>
                    {t.name}
                  </option>
                ))}
              </select>
              {templateId ? (
                <BusyButton
                  className="gw-button-quiet mt-1 text-xs"
                  busy={deleting}
                  busyLabel="Deleting…"
                  disabled={busy}
                  onClick={deleteTemplate}
                >
                  Delete this template
                </BusyButton>
              ) : null}
            </div>
            <div>
              <label htmlFor="import-header-row" className="gw-label">
                Header row
              </label>
              <input
                id="import-header-row"
                type="number"
                min={1}
                className="gw-input mt-1"
                value={mapping.headerRow}
                onChange={(e) =>
                  setMapping({ ...mapping, headerRow: Math.max(1, Number(e.target.value) || 1) })
                }
              />
            </div>
            <div>
              <label htmlFor="import-format" className="gw-label">
                Plate format
              </label>
              <select
                id="import-format"
                className="gw-input mt-1"
                value={format}
                onChange={(e) => setFormat(e.target.value)}
              >
                <option value="">Infer from the wells</option>
                <option value="96">96 (8 × 12)</option>
                <option value="384">384 (16 × 24)</option>
                <option value="1536">1536 (32 × 48)</option>
              </select>
            </div>
          </div>
          <div>
            <label htmlFor="import-fixed-target" className="gw-label">
              One target for every row (when the file has no target column)
            </label>
            <input
              id="import-fixed-target"
              className="gw-input mt-1 max-w-sm"
              value={mapping.fixedTarget ?? ''}
              onChange={(e) =>
                setMapping({ ...mapping, fixedTarget: e.target.value.trim() === '' ? null : e.target.value })
              }
            />
          </div>
          {recognised ? (
            <p
              role="status"
              className="rounded-md border border-lagoon-500 bg-lagoon-100 p-3 text-sm text-lagoon-700"
            >
              This file’s headers match the template “{recognised}”: its mapping, value maps and plate facts
              are applied.
            </p>
          ) : null}
          <LayoutChoice sheet={current} mapping={mapping} onChange={setMapping} />
          <PlateSplitChoice headers={current.headers} mapping={mapping} onChange={setMapping} />
          <div className="overflow-x-auto">
            <MappingStep
              headers={tableOf(current, mapping).headers}
              mapping={mapping}
              onChange={setMapping}
              sample={{
                rows: current.sample,
                headerRow: current.headerRow,
                guessed: current.guess.mapping,
              }}
            />
          </div>
          <ValueMaps
            headers={tableOf(current, mapping).headers}
            values={tableOf(current, mapping).values}
            mapping={mapping}
            onChange={setMapping}
            targets={screens.find((s) => s.id === screenId)?.targets ?? []}
            targetAliases={inspection.targetAliases}
          />
          <PlateFactsForm
            sheets={inspection.sheets.map((s) => s.name)}
            mapping={mapping}
            guessed={
              (recognised ? inspection.recognised?.mapping : current.guess.mapping)?.facts ?? mapping.facts
            }
            found={(recognised ? inspection.recognised?.facts : current.facts) ?? {}}
            onChange={setMapping}
          />
          <div className="flex gap-3">
            <button type="button" className="gw-button-quiet" disabled={busy} onClick={() => setStep(0)}>
              Back
            </button>
            <BusyButton busy={busy} busyLabel="Checking…" onClick={check}>
              Check every row
            </BusyButton>
          </div>
          <ImportProgress progress={progress} />
        </section>
      ) : null}

      {step === 2 && preview ? (
        <section className="space-y-4">
          <PreviewStep
            preview={preview}
            unknownCompoundsPanel={
              <UnknownCompoundsPanel
                unknown={preview.unknownCompounds}
                canRegister={canRegisterCompounds}
                waitFields={() => ({ ...fields(), ...labelFields() })}
                onRegistered={check}
              />
            }
            platesPanel={
              <PlatesInFile
                plates={preview.plates}
                labels={labels}
                onLabel={(key, value) => setLabels({ ...labels, [key]: value })}
              />
            }
          />
          {/* A file of several plates shows each plate's facts, warnings and empty wells in its list. */}
          {!several &&
          (Object.keys(preview.facts).length > 0 ||
            preview.factWarnings.length > 0 ||
            preview.emptyWells > 0) ? (
            <div className="gw-card space-y-1 p-4 text-sm" aria-label="Plate facts and skipped wells">
              {Object.entries(preview.facts).map(([fact, value]) => (
                <p key={fact}>
                  <span className="text-ink-500">{PLATE_FACT_LABEL[fact as PlateFact]}:</span>{' '}
                  <span className="font-mono">{value}</span>
                </p>
              ))}
              {preview.factWarnings.map((warning) => (
                <p key={warning} className="text-signal-warn">
                  {warning}
                </p>
              ))}
              {preview.emptyWells > 0 ? (
                <p>
                  {preview.emptyWells} {preview.emptyWells === 1 ? 'row is' : 'rows are'} marked empty and
                  skipped.
                </p>
              ) : null}
            </div>
          ) : null}
          {stored ? <StoredPlates plates={stored} /> : null}
          <div className="gw-card grid gap-4 p-5 sm:grid-cols-3">
            {several ? (
              <p className="text-sm text-ink-700">
                {preview.plates.length} plates: each is labelled in the list above.
              </p>
            ) : (
              <div>
                <label htmlFor="import-label" className="gw-label">
                  Plate label
                </label>
                <input
                  id="import-label"
                  className="gw-input mt-1"
                  value={label}
                  onChange={(e) => {
                    setLabel(e.target.value);
                    setLabelTouched(true);
                  }}
                />
              </div>
            )}
            <div>
              <label htmlFor="import-template-name" className="gw-label">
                Save this mapping as a template (optional)
              </label>
              <input
                id="import-template-name"
                className="gw-input mt-1"
                value={templateName}
                onChange={(e) => setTemplateName(e.target.value)}
                placeholder="e.g. Rig 2 flat sheet"
              />
            </div>
            <div className="flex items-end gap-3">
              <button
                type="button"
                className="gw-button-quiet"
                disabled={busy || leaving}
                onClick={() => setStep(1)}
              >
                Back to mapping
              </button>
              <BusyButton
                busy={busy || leaving}
                busyLabel="Storing…"
                disabled={
                  stored !== null ||
                  storing !== null ||
                  !preview.ok ||
                  (several ? preview.plates.some((p) => !labels[p.key]?.trim()) : !label.trim())
                }
                onClick={store}
              >
                {stored ? 'Stored' : several ? `Store ${preview.plates.length} plates` : 'Store plate'}
              </BusyButton>
            </div>
            {progress?.work === 'commit' ? (
              <div className="sm:col-span-3">
                <ImportProgress progress={progress} />
              </div>
            ) : null}
            {storing ? (
              <p role="status" className="text-sm text-ink-700 sm:col-span-3">
                {storing}{' '}
                <AppLink href="/plates" className="font-medium text-lagoon-700 underline">
                  Open the plate list
                </AppLink>
              </p>
            ) : null}
            {!preview.ok ? (
              <p className="text-sm text-signal-fail sm:col-span-3">
                Fix the errors above in the file or the mapping; nothing is stored while any row has an error.
              </p>
            ) : null}
          </div>
        </section>
      ) : null}
    </div>
  );
}
