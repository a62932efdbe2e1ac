import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rinkApi } from './keys';

/** The payment service's onboarding page for the payout account; the browser goes there and comes back. */
export const startOnboarding = (slug: string) => api<{ url: string }>(rinkApi(slug, '/billing/payout-account'), { method: 'POST' });

export const useStartOnboarding = (slug: string) => useMutation({ mutationFn: () => startOnboarding(slug) });
