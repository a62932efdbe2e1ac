import { z } from 'zod';
import { leagueReport, moneyReport, platformRinkParams, qualityReport, reportFilterChoices, reportQuery, throughputReport, type ReportName } from '@rinkwright/core';
import { roleAllows } from '../../access';
import { AppError } from '../../http/errors';
import { defineRoute, type RinkContext } from '../../http/route';
import { reportCsv, reportOf, reportOptions, rinkReport } from './service';

const schemas = { throughput: throughputReport, quality: qualityReport, money: moneyReport, leagues: leagueReport } as const;
const tableParams = z.object({ table: z.string().min(1).max(40) });

type Tables = { tables: Record<string, Record<string, unknown>[]> };
const platformTableParams = platformRinkParams.extend({ table: tableParams.shape.table });

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
    handle: ({ ctx }) => reportOptions(ctx.tenantId),
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
        const csv = await reportCsv(ctx.tenantId, report, params.table, (await reportFor(ctx, report, query)) as Tables);
        res.attachment(`${ctx.rinkSlug}-${report}-${params.table}-${query.from}-to-${query.to}.csv`);
        return csv;
      },
    }),
  ]),
  // The platform admin opens the same reports for any rink.
  defineRoute({
    method: 'get',
    path: '/api/platform/rinks/:rinkId/reports',
    summary: 'A rink’s report filter choices (platform admin only)',
    access: 'platform',
    params: platformRinkParams,
    response: reportFilterChoices,
    handle: ({ params }) => reportOptions(params.rinkId),
  }),
  ...(Object.keys(schemas) as ReportName[]).flatMap((report) => [
    defineRoute({
      method: 'get',
      path: `/api/platform/rinks/:rinkId/reports/${report}`,
      summary: `A rink’s ${report} report (platform admin only)`,
      access: 'platform',
      params: platformRinkParams,
      query: reportQuery,
      response: schemas[report],
      handle: ({ params, query }) => reportOf(params.rinkId, report, query),
    }),
    defineRoute({
      method: 'get',
      path: `/api/platform/rinks/:rinkId/reports/${report}/:table.csv`,
      summary: `One table of a rink’s ${report} report as CSV (platform admin only)`,
      access: 'platform',
      params: platformTableParams,
      query: reportQuery,
      response: z.string(),
      produces: 'csv',
      handle: async ({ params, query, res }) => {
        const csv = await reportCsv(params.rinkId, report, params.table, (await reportOf(params.rinkId, report, query)) as Tables);
        res.attachment(`${report}-${params.table}-${query.from}-to-${query.to}.csv`);
        return csv;
      },
    }),
  ]),
];
