import type { ReportName, RinkSummary } from '@rinkwright/core';
import { can } from '../../../lib/rink-context';

// Imported by the rink layout to shape its navigation, so it imports nothing from the core but types: a value
// import here would pull the schemas into the app's first download.

/** The reports the caller may open: every report with report:read, the league usage alone with report:leagues. */
export function reportsFor(rink: Pick<RinkSummary, 'permissions'>): ReportName[] {
  if (can(rink, 'report', 'read')) return ['throughput', 'quality', 'money', 'leagues'];
  if (can(rink, 'report', 'leagues')) return ['leagues'];
  return [];
}
