import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeskSettings } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { stationKeys } from '../../../lib/queries/stations';
import { rinkPath } from './paths';

export const getDeskSettings = (slug: string, signal?: AbortSignal) => api<DeskSettings>(rinkPath(slug, '/desk-settings'), { signal });

export const deskSettingsQuery = (slug: string) =>
  queryOptions({ queryKey: stationKeys.settings(slug), queryFn: ({ signal }) => getDeskSettings(slug, signal) });

export const useDeskSettings = (slug: string) => useQuery(deskSettingsQuery(slug));
