import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MemberRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { leagueKeys, rinkApi } from './keys';

/** The rink's staff, to choose a league's manager from (read only by those who may see the staff list). */
export const getStaff = (slug: string, signal?: AbortSignal) => api<{ members: MemberRow[] }>(rinkApi(slug, '/members'), { signal });

export const staffQuery = (slug: string) => queryOptions({ queryKey: leagueKeys.staff(slug), queryFn: ({ signal }) => getStaff(slug, signal) });

export const useStaff = (slug: string, enabled: boolean) => useQuery({ ...staffQuery(slug), enabled });
