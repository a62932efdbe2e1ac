import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rinkApi } from './keys';

/** Hosted checkout for the rink's plan; the browser goes there and comes back with ?plan=started. */
export const startPlan = (slug: string) => api<{ url: string }>(rinkApi(slug, '/billing/plan'), { method: 'POST' });

export const useStartPlan = (slug: string) => useMutation({ mutationFn: () => startPlan(slug) });
