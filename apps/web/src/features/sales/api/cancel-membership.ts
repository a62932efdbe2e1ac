import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MembershipRow } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkApi, salesKeys } from './keys';

export const cancelMembership = (slug: string, membershipId: string, when: 'now' | 'period_end') =>
  api<MembershipRow[]>(rinkApi(slug, `/memberships/${encodeURIComponent(membershipId)}/cancel`), { method: 'POST', body: { when } });

export function useCancelMembership(slug: string, customerId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ membershipId, when }: { membershipId: string; when: 'now' | 'period_end' }) => cancelMembership(slug, membershipId, when),
    onSettled: () => client.invalidateQueries({ queryKey: salesKeys.customerCredits(slug, customerId) }),
  });
}
