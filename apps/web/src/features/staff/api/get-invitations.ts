import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const getInvitations = (slug: string, signal?: AbortSignal) => api<{ invitations: InvitationRow[] }>(rinkPath(slug, '/invitations'), { signal });

export const invitationsQuery = (slug: string) =>
  queryOptions({ queryKey: staffKeys.invitations(slug), queryFn: ({ signal }) => getInvitations(slug, signal) });

export const useInvitations = (slug: string, enabled = true) => useQuery({ ...invitationsQuery(slug), enabled });
