import { useQuery } from '@tanstack/react-query';
import type { CheckoutStatus } from '@rinkwright/core';
import { api, ApiError } from '../../../lib/api-client';
import { portalKeys } from './keys';

// A checkout started from the portal returns to the portal; the status itself is the public page's endpoint.
export const getCheckoutStatus = (slug: string, sessionId: string, signal?: AbortSignal) =>
  api<CheckoutStatus>(`/api/public/rinks/${encodeURIComponent(slug)}/checkout/${encodeURIComponent(sessionId)}`, { signal });

export function useCheckoutStatus(slug: string, sessionId: string, polling: boolean) {
  return useQuery({
    queryKey: portalKeys.checkout(slug, sessionId),
    queryFn: ({ signal }) => getCheckoutStatus(slug, sessionId, signal),
    enabled: sessionId !== '',
    staleTime: 0,
    refetchInterval: (query) => {
      if (!polling) return false;
      const error = query.state.error;
      if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
      const state = query.state.data?.state;
      return state === 'paid' || state === 'failed' ? false : 1500;
    },
    refetchIntervalInBackground: true,
  });
}
