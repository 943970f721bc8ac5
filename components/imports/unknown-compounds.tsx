'use client';

import { useState } from 'react';
import { BusyButton } from '@/components/ui/busy-button';

/** Posts to an import route and returns its JSON, or throws with the server's message. */
async function post<T>(path: string, body: FormData | object): Promise<T> {
  const response = await fetch(path, {
    method: 'POST',
    ...(body instanceof FormData
      ? { body }
      : { body: JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
  });
  const json = (await response
    .json()
    .catch(() => ({ message: `The server answered ${response.status}.` }))) as T & {
    message?: string;
    fields?: Record<string, string[]>;
  };
  if (!response.ok)
    throw new Error(
      [json.message, ...(json.fields ? Object.values(json.fields).flat() : [])].filter(Boolean).join(' '),
    );
  return json;
}

type Choice = { kind: 'register'; lot: string } | { kind: 'alias'; compound: string };

/**
 * One form for every compound identifier of a file that the registry lacks: register each (with an
 * optional batch) or map it to a registered compound as an alias; all in one request, nothing written
 * when any of them is refused.
 */
export function RegisterUnknownCompounds({
  identifiers,
  draftId,
  onDone,
}: {
  identifiers: string[];
  draftId?: string;
  onDone: (message: string) => void;
}) {
  const [choices, setChoices] = useState<Record<string, Choice>>({});
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const choiceOf = (id: string): Choice => choices[id] ?? { kind: 'register', lot: '' };
  const set = (id: string, choice: Choice) => setChoices({ ...choices, [id]: choice });

  async function submit() {
    setBusy(true);
    setError(null);
    try {
      const entries = identifiers.map((id) => [id, choiceOf(id)] as const);
      const result = await post<{ registered: unknown[]; aliased: unknown[] }>(
        '/api/imports/unknown-compounds',
        {
          ...(draftId ? { draftId } : {}),
          register: entries.flatMap(([identifier, c]) =>
            c.kind === 'register' ? [{ identifier, lot: c.lot }] : [],
          ),
          aliases: entries.flatMap(([alias, c]) =>
            c.kind === 'alias' ? [{ alias, compoundIdentifier: c.compound }] : [],
          ),
        },
      );
      onDone(`Registered ${result.registered.length}, mapped ${result.aliased.length} as aliases.`);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The request failed.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-3">
      <table className="w-full text-sm">
        <thead>
          <tr className="text-left text-ink-500">
            <th className="py-1 pr-3 font-medium">Identifier in the file</th>
            <th className="py-1 pr-3 font-medium">What it is</th>
            <th className="py-1 font-medium">Batch, or the registered compound</th>
          </tr>
        </thead>
        <tbody>
          {identifiers.map((id) => {
            const choice = choiceOf(id);
            return (
              <tr key={id}>
                <td className="py-1 pr-3 font-mono">{id}</td>
                <td className="py-1 pr-3">
                  <select
                    aria-label={`What ${id} is`}
                    className="gw-input"
                    value={choice.kind}
                    onChange={(e) =>
                      set(
                        id,
                        e.target.value === 'alias'
                          ? { kind: 'alias', compound: '' }
                          : { kind: 'register', lot: '' },
                      )
                    }
                  >
                    <option value="register">A new compound: register it</option>
                    <option value="alias">Another name of a registered compound</option>
                  </select>
                </td>
                <td className="py-1">
                  {choice.kind === 'register' ? (
                    <input
                      aria-label={`Batch of ${id} (optional)`}
                      className="gw-input"
                      placeholder="Batch or lot (optional)"
                      value={choice.lot}
                      onChange={(e) => set(id, { kind: 'register', lot: e.target.value })}
                    />
                  ) : (
                    <input
                      aria-label={`Registered compound that ${id} names`}
                      className="gw-input"
                      placeholder="Registered identifier, e.g. GW-0001"
                      value={choice.compound}
                      onChange={(e) => set(id, { kind: 'alias', compound: e.target.value })}
                    />
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p role="alert" aria-live="assertive" className="min-h-5 text-sm font-medium text-signal-fail">
        {error}
      </p>
      <BusyButton busy={busy} busyLabel="Registering…" onClick={submit}>
        {`Register and map ${identifiers.length} identifier${identifiers.length === 1 ? '' : 's'}`}
      </BusyButton>
    </div>
  );
}

/**
 * The check step's panel for compounds the registry lacks: those who may register them do so here and the
 * rows are checked again; anyone else keeps the import waiting, and those who may register are told.
 */
export function UnknownCompoundsPanel({
  unknown,
  canRegister,
  waitFields,
  onRegistered,
}: {
  unknown: { identifier: string; rows: number[] }[];
  canRegister: boolean;
  /** The draft, sheet, mapping, format and label of the import, as the wait request sends them. */
  waitFields: () => Record<string, string>;
  onRegistered: () => void;
}) {
  const [status, setStatus] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const fields = waitFields();

  async function wait() {
    setBusy(true);
    setError(null);
    try {
      const body = new FormData();
      for (const [key, value] of Object.entries(fields)) body.set(key, value);
      const result = await post<{ waitingFor: string[]; notified: string[] }>('/api/imports/wait', body);
      const n = result.notified.length;
      setStatus(
        `This import now waits for ${result.waitingFor.length} compound${result.waitingFor.length === 1 ? '' : 's'}; ` +
          `${n} ${n === 1 ? 'person who may register them was' : 'people who may register them were'} told by e-mail. ` +
          'Resume it from My work once they are registered.',
      );
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The request failed.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <section
      aria-labelledby="unknown-compounds-heading"
      className="space-y-3 rounded-md border border-amber-200 bg-amber-50 p-4 text-sm"
    >
      <h3 id="unknown-compounds-heading" className="font-semibold text-signal-warn">
        {unknown.length} compound identifier{unknown.length === 1 ? '' : 's'} of this file{' '}
        {unknown.length === 1 ? 'is' : 'are'} not registered
      </h3>
      <p className="text-ink-700">
        {unknown
          .map(
            (c) => `${c.identifier} (rows ${c.rows.slice(0, 5).join(', ')}${c.rows.length > 5 ? '…' : ''})`,
          )
          .join('; ')}
      </p>
      {canRegister ? (
        <RegisterUnknownCompounds
          identifiers={unknown.map((c) => c.identifier)}
          {...(fields.draftId ? { draftId: fields.draftId } : {})}
          onDone={(message) => {
            setStatus(message);
            onRegistered();
          }}
        />
      ) : status ? null : (
        <div className="space-y-2">
          <p className="text-ink-700">
            You may not register compounds. Keep this import waiting: everyone who may register compounds is
            told by e-mail, and you resume it from My work once they have registered or mapped these
            identifiers.
          </p>
          <p role="alert" aria-live="assertive" className="min-h-5 font-medium text-signal-fail">
            {error}
          </p>
          <BusyButton busy={busy} busyLabel="Keeping…" onClick={wait}>
            Keep this import waiting for these compounds
          </BusyButton>
        </div>
      )}
      {status ? (
        <p role="status" className="font-medium text-ink-700">
          {status}
        </p>
      ) : null}
    </section>
  );
}
