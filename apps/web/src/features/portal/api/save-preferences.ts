import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PortalRinkDetail, PreferencesInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { portalApi, portalKeys } from './keys';

export const savePreferences = (slug: string, input: PreferencesInput) => api<PreferencesInput>(portalApi(slug, '/preferences'), { method: 'PUT', body: input });

export function useSavePreferences(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: PreferencesInput) => savePreferences(slug, input),
    onSuccess: (preferences) => client.setQueryData<PortalRinkDetail>(portalKeys.rink(slug), (old) => (old ? { ...old, preferences } : old)),
  });
}
