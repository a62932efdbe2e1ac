export const deskKeys = {
  tickets: (slug: string) => ['rink', slug, 'tickets'] as const,
  ticketList: (slug: string, filter: object) => ['rink', slug, 'tickets', 'list', filter] as const,
  ticket: (slug: string, id: string) => ['rink', slug, 'tickets', 'detail', id] as const,
  promise: (slug: string, pairs: number) => ['rink', slug, 'tickets', 'promise', pairs] as const,
  customers: (slug: string) => ['rink', slug, 'customers'] as const,
  customerSearch: (slug: string, q: string) => ['rink', slug, 'customers', 'search', q] as const,
  customer: (slug: string, id: string) => ['rink', slug, 'customers', 'detail', id] as const,
};

export const rinkApi = (slug: string, rest: string) => `/api/rinks/${encodeURIComponent(slug)}${rest}`;
