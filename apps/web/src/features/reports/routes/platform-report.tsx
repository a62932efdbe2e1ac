import { useMemo } from 'react';
import { useOutletContext, useParams } from 'react-router';
import { REPORT_NAMES, type PlatformRinkRow, type ReportName } from '@rinkwright/core';
import { NotFound } from '../../../components/ui/not-found';
import { platformReports } from '../api/keys';
import { ReportPage } from '../components/report-page';

// The platform admin reads every report of any rink, in the rink's own unit; the platform console's rink page
// (the parent route) hands down the rink it shows.
const ALL: ReportName[] = [...REPORT_NAMES];

export function Component() {
  const rink = useOutletContext<PlatformRinkRow>();
  const { report: name } = useParams();
  const reports = useMemo(() => platformReports(rink.id), [rink.id]);
  const report = REPORT_NAMES.find((n) => n === name);
  if (!report) return <NotFound />;
  return <ReportPage reports={reports} report={report} allowed={ALL} unit={rink.unitPreference} title={(label) => `${rink.name}: ${label}`} />;
}
