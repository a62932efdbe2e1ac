import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreview } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { staffKeys } from './keys';

export const getInvitationPreview = (id: string, signal?: AbortSignal) => api<InvitationPreview>(`/api/invitations/${encodeURIComponent(id)}`, { signal });

export const invitationPreviewQuery = (id: string) =>
  queryOptions({ queryKey: staffKeys.invitation(id), queryFn: ({ signal }) => getInvitationPreview(id, signal) });

export const useInvitationPreview = (id: string) => useQuery(invitationPreviewQuery(id));
