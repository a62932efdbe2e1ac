import { z } from 'zod';
import { leagueReport, moneyReport, qualityReport, reportFilterChoices, reportQuery, throughputReport, type ReportName } from '@rinkwright/core';
import { scoped } from '@rinkwright/db';
import { roleAllows } from '../../access';
import { AppError } from '../../http/errors';
import { defineRoute, type RinkContext } from '../../http/route';
import { reportOptions, rinkReport, tableCsv } from './service';

const schemas = { throughput: throughputReport, quality: qualityReport, money: moneyReport, leagues: leagueReport } as const;
const tableParams = z.object({ table: z.string().min(1).max(40) });

// Every report but league usage needs report:read; a league manager holds only report:leagues (their leagues).
async function reportFor(ctx: RinkContext, report: ReportName, query: z.infer<typeof reportQuery>) {
  if (report !== 'leagues' && !roleAllows(ctx.role, { report: ['read'] })) throw AppError.notFound('No such report');
  return rinkReport(ctx, report, query);
}

export const reportRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/rinks/:rinkSlug/reports',
    summary: 'The report filters’ choices (stations, technicians) and the rink’s today in its time zone',
    access: 'rink',
    permission: { report: ['leagues'] },
    response: reportFilterChoices,
    handle: ({ ctx }) => reportOptions(ctx),
  }),
  ...(Object.keys(schemas) as ReportName[]).flatMap((report) => [
    defineRoute({
      method: 'get',
      path: `/api/rinks/:rinkSlug/reports/${report}`,
      summary: `The ${report} report over local days from–to (both included), with an optional period to compare`,
      access: 'rink',
      permission: { report: ['leagues'] },
      query: reportQuery,
      response: schemas[report],
      handle: ({ ctx, query }) => reportFor(ctx, report, query),
    }),
    defineRoute({
      method: 'get',
      path: `/api/rinks/:rinkSlug/reports/${report}/:table.csv`,
      summary: `One table of the ${report} report as CSV, with the same filters`,
      access: 'rink',
      permission: { report: ['leagues'] },
      params: tableParams,
      query: reportQuery,
      response: z.string(),
      produces: 'csv',
      handle: async ({ ctx, params, query, res }) => {
        const answer = (await reportFor(ctx, report, query)) as { tables: Record<string, Record<string, unknown>[]> };
        const rink = await scoped(ctx.tenantId).rink();
        const csv = tableCsv(report, params.table, answer, { currency: rink?.currency ?? 'USD', unitPreference: rink?.unitPreference ?? 'in' });
        res.attachment(`${ctx.rinkSlug}-${report}-${params.table}-${query.from}-to-${query.to}.csv`);
        return csv;
      },
    }),
  ]),
];
