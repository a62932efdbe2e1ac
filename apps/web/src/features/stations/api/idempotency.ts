import { useCallback, useRef } from 'react';
import { newKey } from '../../../lib/outbox';

// An upkeep write must not be logged twice when a button is pressed again or a timed-out request is retried: the
// key is made when the form is submitted and kept while the same values are sent again, so the server answers the
// repeat with its first answer. Changed values are a new action and get a new key.

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
    if (last.current?.values !== text) last.current = { values: text, key: newKey() };
    return last.current.key;
  }, []);
  const settle = useCallback(() => {
    last.current = null;
  }, []);
  return { keyFor, settle };
}

export const idempotencyHeader = (key: string) => ({ 'Idempotency-Key': key });
