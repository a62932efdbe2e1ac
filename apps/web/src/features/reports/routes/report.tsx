import { useMemo } from 'react';
import { useParams } from 'react-router';
import { REPORT_NAMES } from '@rinkwright/core';
import { NotFound } from '../../../components/ui/not-found';
import { useRink } from '../../../lib/rink-context';
import { rinkReports } from '../api/keys';
import { reportsFor } from '../components/access';
import { ReportPage } from '../components/report-page';

const title = (label: string) => `Reports: ${label}`;

export function Component() {
  const rink = useRink();
  const { report: name } = useParams();
  const reports = useMemo(() => rinkReports(rink.slug), [rink.slug]);
  const allowed = reportsFor(rink);
  const report = REPORT_NAMES.find((n) => n === name);
  if (!report || !allowed.includes(report)) return <NotFound />;
  return <ReportPage reports={reports} report={report} allowed={allowed} unit={rink.unitPreference} title={title} />;
}
