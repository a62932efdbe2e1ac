import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvitationRow, InviteInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const createInvitation = (slug: string, input: InviteInput) =>
  api<{ invitations: InvitationRow[] }>(rinkPath(slug, '/invitations'), { method: 'POST', body: input });

export function useCreateInvitation(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteInput) => createInvitation(slug, input),
    onSuccess: (data) => client.setQueryData(staffKeys.invitations(slug), data),
  });
}
