import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PortalRinkDetail } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { portalApi, portalKeys } from './keys';

export type CancelWhen = 'now' | 'period_end';

export const cancelMembership = (slug: string, membershipId: string, when: CancelWhen) =>
  api<PortalRinkDetail>(portalApi(slug, `/memberships/${encodeURIComponent(membershipId)}/cancel`), { method: 'POST', body: { when } });

export function useCancelMembership(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ membershipId, when }: { membershipId: string; when: CancelWhen }) => cancelMembership(slug, membershipId, when),
    onSuccess: (detail) => {
      client.setQueryData(portalKeys.rink(slug), detail);
      return client.invalidateQueries({ queryKey: portalKeys.home() });
    },
  });
}
