import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SkateProfileInput, SkateProfileRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const updateProfile = (slug: string, customerId: string, profileId: string, input: SkateProfileInput) =>
  api<SkateProfileRow>(rinkApi(slug, `/customers/${customerId}/profiles/${profileId}`), { method: 'PUT', body: input });

export function useUpdateProfile(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ profileId, input }: { profileId: string; input: SkateProfileInput }) => updateProfile(slug, customerId, profileId, input),
    onSuccess: () => client.invalidateQueries({ queryKey: deskKeys.customer(slug, customerId) }),
  });
}
