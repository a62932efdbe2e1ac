export const servicesPath = (slug: string, rest = '') => `/api/rinks/${encodeURIComponent(slug)}/services${rest}`;
