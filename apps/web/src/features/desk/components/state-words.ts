import type { TicketState } from '@rinkwright/core';

export const STATE_WORDS: Record<TicketState, string> = { waiting: 'Waiting', on_station: 'On station', ready: 'Ready', collected: 'Collected', void: 'Void' };
