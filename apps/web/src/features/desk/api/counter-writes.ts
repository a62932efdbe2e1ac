import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import type { CorrectionInput, CreateTicketInput, LogSharpeningInput, RerunReadingInput, TicketDetail, TransitionInput } from '@rinkwright/core';
import { newKey, send } from '../../../lib/outbox';
import { deskKeys, rinkApi } from './keys';

// Every counter write, through the outbox (one key per action, kept until the server has answered).

export interface CounterWrite {
  path: string;
  body: unknown;
  label: string;
}

export const writes = {
  createTicket: (slug: string, input: CreateTicketInput, label: string): CounterWrite => ({ path: rinkApi(slug, '/tickets'), body: input, label }),
  moveTicket: (slug: string, ticketId: string, input: TransitionInput, label: string): CounterWrite => ({ path: rinkApi(slug, `/tickets/${ticketId}/transitions`), body: input, label }),
  logSharpening: (slug: string, ticketId: string, input: LogSharpeningInput, label: string): CounterWrite => ({ path: rinkApi(slug, `/tickets/${ticketId}/sharpenings`), body: input, label }),
  addReadings: (slug: string, sharpeningId: string, input: RerunReadingInput, label: string): CounterWrite => ({ path: rinkApi(slug, `/sharpenings/${sharpeningId}/readings`), body: input, label }),
  correct: (slug: string, sharpeningId: string, input: CorrectionInput, label: string): CounterWrite => ({ path: rinkApi(slug, `/sharpenings/${sharpeningId}/corrections`), body: input, label }),
};

/**
 * Sends one counter write. `busy` disables the button from the press until the outbox has it, so a double
 * press makes one action; the result is the ticket as the server now has it, or `queued` while offline.
 */
export function useCounterWrite(slug: string) {
  const client = useQueryClient();
  const [busy, setBusy] = useState(false);
  const run = useCallback(
    async (write: CounterWrite) => {
      setBusy(true);
      try {
        const outcome = await send<TicketDetail>({ key: newKey(), rinkSlug: slug, method: 'POST', ...write });
        if (!outcome.queued) client.setQueryData(deskKeys.ticket(slug, outcome.result.id), outcome.result);
        await client.invalidateQueries({ queryKey: deskKeys.tickets(slug) });
        return outcome;
      } finally {
        setBusy(false);
      }
    },
    [client, slug],
  );
  return { run, busy };
}
