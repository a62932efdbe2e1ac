export const leagueKeys = {
  all: (slug: string) => ['rink', slug, 'leagues'] as const,
  list: (slug: string) => ['rink', slug, 'leagues', 'list'] as const,
  detail: (slug: string, id: string) => ['rink', slug, 'leagues', 'detail', id] as const,
  staff: (slug: string) => ['rink', slug, 'leagues', 'staff'] as const,
};

export const rinkApi = (slug: string, rest: string) => `/api/rinks/${encodeURIComponent(slug)}${rest}`;
