import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { useForm, type Path } from 'react-hook-form';
import { reportQuery, type ReportName, type ReportQuery } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import type { ReportFilterChoices } from '../api/get-report-filters';
import { REPORT_FILTERS, isDay, previousPeriod, queryInput, type CompareMode, type FilterValues } from './filters';
import { formatDay, formatPeriod } from './numbers';

const FIELDS: readonly Path<FilterValues>[] = ['from', 'to', 'stationId', 'technicianId', 'compareFrom', 'compareTo'];

const COMPARE_OPTIONS: { value: CompareMode; label: string }[] = [
  { value: 'none', label: 'Nothing' },
  { value: 'previous', label: 'The period before' },
  { value: 'custom', label: 'Dates I choose' },
];

// The form's values are turned into the API's query and checked by the route's own schema, so a message under a
// field is the one the server would give.
const schema = (report: ReportName) =>
  z
    .object({ from: z.string(), to: z.string(), stationId: z.string(), technicianId: z.string(), compare: z.enum(['none', 'previous', 'custom']), compareFrom: z.string(), compareTo: z.string() })
    .transform((v) => queryInput(v, report))
    .pipe(reportQuery);

export interface FilterProblems {
  message: string;
  fields: Record<string, string[]>;
}

export function FilterForm({
  report,
  choices,
  values,
  problems,
  onApply,
}: {
  report: ReportName;
  choices: ReportFilterChoices;
  values: FilterValues;
  /** Problems found in the address or answered by the API for these filters. */
  problems: FilterProblems | null;
  onApply: (values: FilterValues) => void;
}) {
  const takes = REPORT_FILTERS[report];
  const { register, handleSubmit, formState, setError, watch, getValues } = useForm<FilterValues, unknown, ReportQuery>({
    resolver: zodResolver(schema(report)),
    defaultValues: values,
  });
  const e = formState.errors;
  const [compare, from, to] = watch(['compare', 'from', 'to']);
  const before = compare === 'previous' && isDay(from) && isDay(to) && from <= to ? previousPeriod(from, to) : null;

  useEffect(() => {
    if (!problems) return;
    for (const [field, messages] of Object.entries(problems.fields)) {
      if ((FIELDS as readonly string[]).includes(field)) setError(field as Path<FilterValues>, { type: 'server', message: messages.join(' ') });
    }
  }, [problems, setError]);

  const onSubmit = handleSubmit(() => onApply(getValues()));
  const placed = problems ? Object.keys(problems.fields).some((f) => (FIELDS as readonly string[]).includes(f)) : false;

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Report filters" className="rounded-xl border border-rule bg-white p-5 shadow-sm">
      {problems ? (
        <div className="mb-4">
          <Alert>{placed ? `${problems.message} See the fields marked below.` : problems.message}</Alert>
        </div>
      ) : null}
      <div className="grid items-start gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <TextField label="From" type="date" error={e.from?.message} {...register('from')} />
        <TextField label="To" type="date" error={e.to?.message} {...register('to')} />
        {takes.station ? (
          <SelectField
            label="Station"
            options={[{ value: '', label: 'All stations' }, ...choices.stations.map((s) => ({ value: s.id, label: s.name }))]}
            error={e.stationId?.message}
            {...register('stationId')}
          />
        ) : null}
        {takes.technician ? (
          <SelectField
            label="Technician"
            options={[{ value: '', label: 'All technicians' }, ...choices.technicians.map((t) => ({ value: t.id, label: t.name }))]}
            error={e.technicianId?.message}
            {...register('technicianId')}
          />
        ) : null}
        {takes.compare ? (
          <SelectField
            label="Compare with"
            options={COMPARE_OPTIONS}
            hint={before ? `${formatPeriod({ from: before.compareFrom, to: before.compareTo })}, the same number of days.` : undefined}
            {...register('compare')}
          />
        ) : null}
        {takes.compare && compare === 'custom' ? (
          <>
            <TextField label="Compare from" type="date" error={e.compareFrom?.message} {...register('compareFrom')} />
            <TextField label="Compare to" type="date" error={e.compareTo?.message} {...register('compareTo')} />
          </>
        ) : null}
        <div className="sm:pt-6">
          <Button type="submit" className="w-full sm:w-auto">
            Show report
          </Button>
        </div>
      </div>
      <p className="mt-3 text-sm text-ink-soft">
        Days are the rink's days ({choices.timeZone.replaceAll('_', ' ')}), both ends included; today is {formatDay(choices.today)}.
      </p>
    </form>
  );
}
