import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { rinkApi } from './keys';

/** Hosted checkout for a league pack into the league's pool; the browser goes there and comes back. */
export const buyPack = (slug: string, leagueId: string, productId: string) =>
  api<{ url: string }>(rinkApi(slug, `/leagues/${encodeURIComponent(leagueId)}/checkout`), { method: 'POST', body: { productId } });

export const useBuyPack = (slug: string, leagueId: string) => useMutation({ mutationFn: (productId: string) => buyPack(slug, leagueId, productId) });
