import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MemberRow, StaffRole } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { rinkPath, staffKeys } from './keys';

export const updateMember = (slug: string, memberId: string, role: StaffRole) =>
  api<{ members: MemberRow[] }>(rinkPath(slug, `/members/${memberId}`), { method: 'PATCH', body: { role } });

export function useUpdateMember(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: StaffRole }) => updateMember(slug, memberId, role),
    onSuccess: (data) => client.setQueryData(staffKeys.members(slug), data),
  });
}
