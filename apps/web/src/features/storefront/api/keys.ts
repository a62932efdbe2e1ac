// The public page is read by anyone, signed in or not, so its keys live apart from the rink's staff data.
export const publicKeys = {
  rink: (slug: string) => ['public', slug, 'rink'] as const,
  checkout: (slug: string, sessionId: string) => ['public', slug, 'checkout', sessionId] as const,
};

export const publicApi = (slug: string, rest = '') => `/api/public/rinks/${encodeURIComponent(slug)}${rest}`;
