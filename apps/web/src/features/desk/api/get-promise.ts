import { useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { deskKeys, rinkApi } from './keys';

export const getPromise = (slug: string, pairs: number, signal?: AbortSignal) =>
  api<{ promisedAt: string; minutesPerPair: number; stationsActive: number }>(rinkApi(slug, `/promise?pairs=${pairs}`), { signal });

export const usePromise = (slug: string, pairs: number) =>
  useQuery({ queryKey: deskKeys.promise(slug, pairs), queryFn: ({ signal }) => getPromise(slug, pairs, signal), refetchInterval: 30_000, retry: false });
