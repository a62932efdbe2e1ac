import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckoutStatus } from '@rinkwright/core';
import { api, ApiError } from '../../../lib/api-client';
import { publicApi, publicKeys } from './keys';

export const POLL_MS = 1500;

export const getCheckoutStatus = (slug: string, sessionId: string, signal?: AbortSignal) =>
  api<CheckoutStatus>(publicApi(slug, `/checkout/${encodeURIComponent(sessionId)}`), { signal });

export const checkoutStatusQuery = (slug: string, sessionId: string) =>
  queryOptions({ queryKey: publicKeys.checkout(slug, sessionId), queryFn: ({ signal }) => getCheckoutStatus(slug, sessionId, signal), staleTime: 0 });

/** Asks again every 1.5 s while the payment service has not yet confirmed; `polling` false stops asking. */
export function useCheckoutStatus(slug: string, sessionId: string, polling: boolean) {
  return useQuery({
    ...checkoutStatusQuery(slug, sessionId),
    enabled: sessionId !== '',
    refetchInterval: (query) => {
      if (!polling) return false;
      const error = query.state.error;
      // An unknown session or rink will not appear by asking again.
      if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
      const state = query.state.data?.state;
      return state === 'paid' || state === 'failed' ? false : POLL_MS;
    },
    refetchIntervalInBackground: true,
  });
}
