'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { BusyButton } from '@/components/ui/busy-button';

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
  const [busy, setBusy] = useState<'check' | 'register' | null>(null);

  async function run(commit: boolean) {
    if (!file) return;
    setBusy(commit ? 'register' : 'check');
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
      setBusy(null);
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
        <BusyButton
          className="gw-button-quiet"
          busy={busy === 'check'}
          busyLabel="Checking rows…"
          disabled={!file || busy !== null}
          onClick={() => run(false)}
        >
          Check rows
        </BusyButton>
        {/* Registered once: the same sheet cannot be sent twice without checking it again. */}
        <BusyButton
          busy={busy === 'register'}
          busyLabel={`Registering ${result?.rows.length ?? ''} compound(s)…`}
          disabled={!file || busy !== null || !result?.ok || result.registered > 0}
          onClick={() => run(true)}
        >
          Register {result?.ok ? result.rows.length : ''} compound(s)
        </BusyButton>
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
