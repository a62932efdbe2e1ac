import { useMutation } from '@tanstack/react-query';
import type { CheckoutInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { publicApi } from './keys';

export const startCheckout = (slug: string, input: CheckoutInput) => api<{ url: string }>(publicApi(slug, '/checkout'), { method: 'POST', body: input });

export const useStartCheckout = (slug: string) => useMutation({ mutationFn: (input: CheckoutInput) => startCheckout(slug, input) });
