import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { portalApi } from './keys';

export const startPortalCheckout = (slug: string, productId: string) => api<{ url: string }>(portalApi(slug, '/checkout'), { method: 'POST', body: { productId } });

export const useStartPortalCheckout = (slug: string) => useMutation({ mutationFn: (productId: string) => startPortalCheckout(slug, productId) });
