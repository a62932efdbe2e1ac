import { queryOptions, useQuery } from '@tanstack/react-query';
import { bandsFor, type DeskSettings, type LevelBands, type StationRow } from '@rinkwright/core';
import { api } from '../api-client';

// The rink's stations, read by the counter (where to log a pair) and the stations pages alike.
export const stationKeys = {
  all: (slug: string) => ['rink', slug, 'stations'] as const,
  list: (slug: string) => ['rink', slug, 'stations', 'list'] as const,
  detail: (slug: string, id: string) => ['rink', slug, 'stations', 'detail', id] as const,
  settings: (slug: string) => ['rink', slug, 'stations', 'desk-settings'] as const,
};

export const stationsQuery = (slug: string) =>
  queryOptions({
    queryKey: stationKeys.list(slug),
    queryFn: ({ signal }) => api<{ stations: StationRow[] }>(`/api/rinks/${encodeURIComponent(slug)}/stations`, { signal }),
  });

export const useStations = (slug: string) => useQuery(stationsQuery(slug));

export const deskSettingsQuery = (slug: string) =>
  queryOptions({
    queryKey: stationKeys.settings(slug),
    queryFn: ({ signal }) => api<DeskSettings>(`/api/rinks/${encodeURIComponent(slug)}/desk-settings`, { signal }),
    staleTime: 60_000,
  });

/** The rink's level bands and drift watch settings, for showing any reading in its band. */
export const useDeskSettings = (slug: string) => useQuery(deskSettingsQuery(slug));

/** The limits a station's readings are judged by: its own, or the rink's, or the precision pair. */
export function bandsOfStation(settings: DeskSettings | undefined, station: StationRow | undefined): LevelBands | null {
  if (!settings) return null;
  return bandsFor({ rink: settings, station: station ?? null, precision: station?.precision ?? false });
}
