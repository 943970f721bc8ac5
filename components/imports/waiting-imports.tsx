'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { AppLink } from '@/components/ui/app-link';
import { BusyButton } from '@/components/ui/busy-button';
import { RegisterUnknownCompounds } from './unknown-compounds';

/** A waiting import as the list shows it (lib/compounds/waiting-imports.ts, WaitingImport). */
export interface WaitingImportItem {
  id: string;
  filename: string;
  screenName: string;
  ownerName: string;
  ownedByActor: boolean;
  waitingSince: string;
  waitingFor: string[];
  missing: string[];
}

/** Discards the person's own waiting import after asking. */
function DiscardButton({ draftId, filename }: { draftId: string; filename: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function discard() {
    if (!window.confirm(`Discard the waiting import of ${filename}? You would read the file again.`)) return;
    const body = new FormData();
    body.set('draftId', draftId);
    setBusy(true);
    setError(null);
    try {
      const response = await fetch('/api/imports/discard', { method: 'POST', body });
      if (response.ok) return router.refresh();
      const json = (await response.json().catch(() => ({}))) as { message?: string };
      setError(json.message ?? `The server answered ${response.status}.`);
    } catch {
      setError('The request did not reach Gatewell; try again.');
    } finally {
      setBusy(false);
    }
  }
  return (
    <>
      <BusyButton className="gw-button-quiet" busy={busy} busyLabel="Discarding…" onClick={discard}>
        Discard
      </BusyButton>
      {error ? (
        <span role="alert" className="text-signal-fail">
          {error}
        </span>
      ) : null}
    </>
  );
}

/**
 * Imports that wait for compounds: their owners resume or discard them; those who may register compounds
 * register or map the identifiers still missing right here.
 */
export function WaitingImports({ items, canRegister }: { items: WaitingImportItem[]; canRegister: boolean }) {
  const router = useRouter();
  const [done, setDone] = useState<string | null>(null);
  return (
    <div className="space-y-4">
      {done ? (
        <p role="status" className="text-sm font-medium text-ink-700">
          {done}
        </p>
      ) : null}
      <ul className="space-y-4">
        {items.map((item) => (
          <li
            key={item.id}
            id={`waiting-import-${item.id}`}
            className="scroll-mt-4 rounded-md border border-ink-100 p-4 text-sm"
            aria-label={`Import of ${item.filename}`}
          >
            <p>
              <span className="font-semibold">{item.filename}</span> ({item.screenName}), imported by{' '}
              {item.ownedByActor ? 'you' : item.ownerName}, waiting since{' '}
              <time dateTime={item.waitingSince}>{item.waitingSince.slice(0, 16).replace('T', ' ')} UTC</time>
            </p>
            {item.missing.length ? (
              <p className="text-signal-warn">Still not registered: {item.missing.join(', ')}</p>
            ) : (
              <p className="text-signal-pass">
                Every compound it waited for is registered ({item.waitingFor.join(', ')})
                {item.ownedByActor ? '.' : `; ${item.ownerName} may resume it.`}
              </p>
            )}
            {canRegister && item.missing.length ? (
              <div className="mt-3">
                <RegisterUnknownCompounds
                  identifiers={item.missing}
                  draftId={item.id}
                  onDone={(message) => {
                    setDone(`${item.filename}: ${message}`);
                    router.refresh();
                  }}
                />
              </div>
            ) : null}
            {item.ownedByActor ? (
              <div className="mt-3 flex items-center gap-3">
                <AppLink href={`/plates/import?resume=${item.id}`} className="gw-button">
                  Resume the import
                </AppLink>
                <DiscardButton draftId={item.id} filename={item.filename} />
              </div>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
