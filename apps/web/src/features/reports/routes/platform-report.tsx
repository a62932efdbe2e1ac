import { useMemo, useState } from 'react';
import { useOutletContext, useParams } from 'react-router';
import { REPORT_NAMES, type PlatformRinkRow, type ReportName, type UnitPreference } from '@rinkwright/core';
import { SelectField } from '../../../components/ui/field';
import { NotFound } from '../../../components/ui/not-found';
import { platformReports } from '../api/keys';
import { ReportPage } from '../components/report-page';

// The platform admin reads every report of any rink; the platform console's rink page (the parent route) hands
// down the rink it shows.
const ALL: ReportName[] = [...REPORT_NAMES];

const UNITS: { value: UnitPreference; label: string }[] = [
  { value: 'in', label: 'Thousandths of an inch (thou)' },
  { value: 'mm', label: 'Hundredths of a millimetre' },
];

export function Component() {
  const rink = useOutletContext<PlatformRinkRow>();
  const { report: name } = useParams();
  // The console's rink list carries no unit preference, so the reader chooses how readings are written here.
  const [unit, setUnit] = useState<UnitPreference>('in');
  const reports = useMemo(() => platformReports(rink.id), [rink.id]);
  const report = REPORT_NAMES.find((n) => n === name);
  if (!report) return <NotFound />;
  const actions =
    report === 'quality' ? (
      <SelectField
        label="Readings in"
        options={UNITS}
        value={unit}
        onChange={(e) => setUnit(e.target.value === 'mm' ? 'mm' : 'in')}
        hint="A CSV download uses the rink's own unit; its headers name it."
        className="w-72"
      />
    ) : null;
  return <ReportPage reports={reports} report={report} allowed={ALL} unit={unit} title={(label) => `${rink.name}: ${label}`} actions={actions} />;
}
