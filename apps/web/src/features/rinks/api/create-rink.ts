import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateRinkInput } from '@rinkwright/core';
import { api } from '../../../lib/api-client';
import { meKey } from '../../../lib/session';

export const createRink = (input: CreateRinkInput) => api<{ slug: string }>('/api/rinks', { method: 'POST', body: input });

export function useCreateRink() {
  const client = useQueryClient();
  return useMutation({ mutationFn: createRink, onSuccess: () => client.invalidateQueries({ queryKey: meKey }) });
}
