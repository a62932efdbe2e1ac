export const staffKeys = {
  members: (slug: string) => ['rink', slug, 'staff', 'members'] as const,
  invitations: (slug: string) => ['rink', slug, 'staff', 'invitations'] as const,
  invitation: (id: string) => ['invitation', id] as const,
};

export const rinkPath = (slug: string, rest = '') => `/api/rinks/${encodeURIComponent(slug)}${rest}`;
