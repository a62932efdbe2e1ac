import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SkateProfileInput, SkateProfileRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const addProfile = (slug: string, customerId: string, input: SkateProfileInput) =>
  api<SkateProfileRow>(rinkApi(slug, `/customers/${customerId}/profiles`), { method: 'POST', body: input });

export function useAddProfile(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: SkateProfileInput) => addProfile(slug, customerId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: deskKeys.customer(slug, customerId) }),
  });
}
