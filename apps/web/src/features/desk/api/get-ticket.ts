import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TicketDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const getTicket = (slug: string, id: string, signal?: AbortSignal) => api<TicketDetail>(rinkApi(slug, `/tickets/${id}`), { signal });

export const ticketQuery = (slug: string, id: string) =>
  queryOptions({ queryKey: deskKeys.ticket(slug, id), queryFn: ({ signal }) => getTicket(slug, id, signal), refetchInterval: 10_000 });

export const useTicket = (slug: string, id: string) => useQuery(ticketQuery(slug, id));
