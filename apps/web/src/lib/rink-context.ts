import { useOutletContext } from 'react-router';
import type { RinkSummary } from '@rinkwright/core';

/** The rink a page under /rinks/:rinkSlug belongs to, loaded once by the rink layout. */
export function useRink(): RinkSummary {
  return useOutletContext<RinkSummary>();
}

export function can(rink: Pick<RinkSummary, 'permissions'>, resource: string, action: string): boolean {
  return rink.permissions[resource]?.includes(action) ?? false;
}
