import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TicketState, TicketSummary } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export interface TicketFilter {
  state?: TicketState | 'open';
  stationId?: string;
}

export const getTickets = (slug: string, filter: TicketFilter, signal?: AbortSignal) => {
  const params = new URLSearchParams(Object.entries(filter).filter((e): e is [string, string] => Boolean(e[1])));
  return api<{ tickets: TicketSummary[] }>(rinkApi(slug, `/tickets?${params}`), { signal });
};

/** The queue board polls: several tablets work the same queue, and each must see the others' moves. */
export const ticketsQuery = (slug: string, filter: TicketFilter) =>
  queryOptions({ queryKey: deskKeys.ticketList(slug, filter), queryFn: ({ signal }) => getTickets(slug, filter, signal), refetchInterval: 5000 });

export const useTickets = (slug: string, filter: TicketFilter) => useQuery(ticketsQuery(slug, filter));
