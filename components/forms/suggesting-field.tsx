'use client';

import { useEffect, useRef, useState } from 'react';
import { Field } from './field';

/** Wait after the last key before asking (common practice for type-ahead, no source). */
const DEBOUNCE_MS = 150;

/**
 * A labelled text input whose datalist is filled as the person types: after each pause it fetches
 * `${source}&q=<text>` (a JSON `{ suggestions: string[] }`) and offers what came back. A failed fetch
 * leaves the suggestions as they were; the field is still a plain input of its form.
 */
export function SuggestingField({
  source,
  listId,
  defaultValue,
  ...field
}: {
  label: string;
  name: string;
  id: string;
  listId: string;
  /** The suggestions route with its fixed query, e.g. `/api/audit/suggestions?kind=plate`. */
  source: string;
  hint?: string;
  defaultValue?: string | undefined;
  errors?: string[] | undefined;
}) {
  const [text, setText] = useState<string | null>(null);
  const [suggestions, setSuggestions] = useState<string[]>([]);
  const asked = useRef<string | null>(null);

  useEffect(() => {
    if (text === null || asked.current === text) return;
    const controller = new AbortController();
    const timer = setTimeout(async () => {
      try {
        const answer = await fetch(`${source}&q=${encodeURIComponent(text)}`, { signal: controller.signal });
        if (!answer.ok) return;
        const body = (await answer.json()) as { suggestions?: unknown };
        if (Array.isArray(body.suggestions)) {
          asked.current = text;
          setSuggestions(body.suggestions.filter((s): s is string => typeof s === 'string'));
        }
      } catch {
        // Aborted by the next key, or the network: keep what is offered.
      }
    }, DEBOUNCE_MS);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [source, text]);

  return (
    <>
      <Field
        {...field}
        list={listId}
        defaultValue={defaultValue}
        autoComplete="off"
        onFocus={(event) => setText(event.currentTarget.value.trim())}
        onChange={(event) => setText(event.currentTarget.value.trim())}
      />
      <datalist id={listId}>
        {suggestions.map((value) => (
          <option key={value} value={value} />
        ))}
      </datalist>
    </>
  );
}
