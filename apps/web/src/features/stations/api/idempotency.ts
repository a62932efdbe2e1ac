import { useCallback, useRef } from 'react';

// An upkeep write must not be logged twice when a button is pressed again or a timed-out request is retried: the
// key is made when the form is submitted and kept while the same values are sent again, so the server answers the
// repeat with its first answer. Changed values are a new action and get a new key.

function freshKey(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  // randomUUID exists only in secure contexts; a counter tablet on a plain-http LAN address still needs a key.
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
}

export interface ActionKey {
  /** The key for this submission: the same one while the values are unchanged and not yet accepted. */
  keyFor: (values: unknown) => string;
  /** The server accepted the action: the next submission is a new one. */
  settle: () => void;
}

export function useActionKey(): ActionKey {
  const last = useRef<{ values: string; key: string } | null>(null);
  const keyFor = useCallback((values: unknown) => {
    const text = JSON.stringify(values);
    if (last.current?.values !== text) last.current = { values: text, key: freshKey() };
    return last.current.key;
  }, []);
  const settle = useCallback(() => {
    last.current = null;
  }, []);
  return { keyFor, settle };
}

export const idempotencyHeader = (key: string) => ({ 'Idempotency-Key': key });
