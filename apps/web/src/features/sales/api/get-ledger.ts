import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerResponse } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const getLedger = (slug: string, customerId: string, signal?: AbortSignal) =>
  api<LedgerResponse>(rinkApi(slug, `/customers/${encodeURIComponent(customerId)}/ledger`), { signal });

export const ledgerQuery = (slug: string, customerId: string) =>
  queryOptions({ queryKey: salesKeys.ledger(slug, customerId), queryFn: ({ signal }) => getLedger(slug, customerId, signal) });

export const useLedger = (slug: string, customerId: string) => useQuery(ledgerQuery(slug, customerId));
