import { useCallback, useMemo, useRef } from 'react';
import { newKey } from '../../../lib/outbox';

/**
 * The Idempotency-Key of one press of a money button (a sale, a refund). Sent directly, never through the
 * offline outbox: money must not move by itself hours later. The key is made when the button is first pressed
 * and kept for a retry of that same press, so a retry after a lost answer cannot charge twice; it is dropped once
 * the server has answered or the input changes (the same key with another body is refused).
 */
export function usePressKey() {
  const key = useRef<string | null>(null);
  const take = useCallback(() => (key.current ??= newKey()), []);
  const done = useCallback(() => {
    key.current = null;
  }, []);
  return useMemo(() => ({ take, done }), [take, done]);
}
