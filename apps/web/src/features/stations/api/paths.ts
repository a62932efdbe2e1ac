export const rinkPath = (slug: string, rest = '') => `/api/rinks/${encodeURIComponent(slug)}${rest}`;
export const stationPath = (slug: string, stationId: string, rest = '') => rinkPath(slug, `/stations/${encodeURIComponent(stationId)}${rest}`);
