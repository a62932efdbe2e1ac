import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const removeMember = (slug: string, memberId: string) => api<{ ok: true }>(rinkPath(slug, `/members/${memberId}`), { method: 'DELETE' });

export function useRemoveMember(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => removeMember(slug, memberId),
    onSuccess: () => client.invalidateQueries({ queryKey: staffKeys.members(slug) }),
  });
}
