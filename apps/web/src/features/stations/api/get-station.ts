import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StationDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { stationPath } from './paths';

export const getStation = (slug: string, stationId: string, signal?: AbortSignal) => api<StationDetail>(stationPath(slug, stationId), { signal });

export const stationQuery = (slug: string, stationId: string) =>
  queryOptions({ queryKey: stationKeys.detail(slug, stationId), queryFn: ({ signal }) => getStation(slug, stationId, signal) });

export const useStation = (slug: string, stationId: string) => useQuery(stationQuery(slug, stationId));
