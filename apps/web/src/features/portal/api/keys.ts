// The skater's own data, apart from any rink's staff data (a skater may also work at a rink).
export const portalKeys = {
  all: ['portal'] as const,
  home: () => ['portal', 'home'] as const,
  rink: (slug: string) => ['portal', slug, 'detail'] as const,
  selling: (slug: string) => ['portal', slug, 'selling'] as const,
  checkout: (slug: string, sessionId: string) => ['portal', slug, 'checkout', sessionId] as const,
};

export const portalApi = (slug: string, rest = '') => `/api/portal/rinks/${encodeURIComponent(slug)}${rest}`;
