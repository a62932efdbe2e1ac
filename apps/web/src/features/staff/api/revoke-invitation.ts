import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const revokeInvitation = (slug: string, invitationId: string) =>
  api<{ ok: true }>(rinkPath(slug, `/invitations/${invitationId}`), { method: 'DELETE' });

export function useRevokeInvitation(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(slug, invitationId),
    onSuccess: () => client.invalidateQueries({ queryKey: staffKeys.invitations(slug) }),
  });
}
