import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const getMembers = (slug: string, signal?: AbortSignal) => api<{ members: MemberRow[] }>(rinkPath(slug, '/members'), { signal });

export const membersQuery = (slug: string) => queryOptions({ queryKey: staffKeys.members(slug), queryFn: ({ signal }) => getMembers(slug, signal) });

export const useMembers = (slug: string) => useQuery(membersQuery(slug));
