'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';

interface Result {
  rows: { row: number; input: { identifier: string; name: string; lot: string } | null; errors: string[] }[];
  problems: string[];
  ok: boolean;
  registered: number;
}

async function send(file: File, commit: boolean): Promise<Result> {
  const body = new FormData();
  body.set('file', file);
  body.set('commit', String(commit));
  const response = await fetch('/api/compounds/bulk', { method: 'POST', body });
  const json = (await response.json().catch(() => ({}))) as Result & { message?: string };
  if (!response.ok) throw new Error(json.message ?? `The server answered ${response.status}.`);
  return json;
}

/** Registers many compounds from one spreadsheet: check every row first, then register all or none. */
export function BulkRegister() {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function run(commit: boolean) {
    if (!file) return;
    setBusy(true);
    setMessage(null);
    try {
      const answer = await send(file, commit);
      setResult(answer);
      if (commit && answer.ok) {
        setMessage({ ok: true, text: `${answer.registered} compound(s) registered.` });
        router.refresh();
      } else if (!answer.ok)
        setMessage({ ok: false, text: 'Nothing was registered: fix the rows below and check again.' });
    } catch (e) {
      setMessage({ ok: false, text: e instanceof Error ? e.message : 'The request failed.' });
    } finally {
      setBusy(false);
    }
  }

  const errors = result ? [...result.problems, ...result.rows.flatMap((r) => r.errors)] : [];
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-700">
        One compound per row, under a header row naming Identifier and any of Name, SMILES, Molecular weight,
        Lot, Purity, Stock (mM) and Solvent. Rows with a lot also register that batch.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="bulk-file" className="gw-label">
            Registration sheet (xlsx, xls or csv)
          </label>
          <input
            id="bulk-file"
            type="file"
            accept=".xlsx,.xls,.csv"
            className="gw-input mt-1"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              setResult(null);
            }}
          />
        </div>
        <button type="button" className="gw-button-quiet" disabled={!file || busy} onClick={() => run(false)}>
          Check rows
        </button>
        <button
          type="button"
          className="gw-button"
          disabled={!file || busy || !result?.ok}
          onClick={() => run(true)}
        >
          Register {result?.ok ? result.rows.length : ''} compound(s)
        </button>
      </div>
      <p
        role="status"
        aria-live="polite"
        className={`min-h-5 text-sm font-medium ${message?.ok ? 'text-signal-pass' : 'text-signal-fail'}`}
      >
        {message?.text}
      </p>
      {result && errors.length === 0 && !result.registered ? (
        <p className="text-sm text-signal-pass">All {result.rows.length} rows are ready to register.</p>
      ) : null}
      {errors.length ? (
        <ul className="max-h-64 list-disc space-y-1 overflow-auto pl-5 text-sm text-signal-fail">
          {errors.map((e) => (
            <li key={e}>{e}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
