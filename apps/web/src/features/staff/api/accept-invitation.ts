import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meKey } from '../../../lib/session';

export const acceptInvitation = (id: string) => api<{ slug: string }>(`/api/invitations/${encodeURIComponent(id)}/accept`, { method: 'POST' });

export function useAcceptInvitation() {
  const client = useQueryClient();
  return useMutation({ mutationFn: acceptInvitation, onSuccess: () => client.invalidateQueries({ queryKey: meKey }) });
}
