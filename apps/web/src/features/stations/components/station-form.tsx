import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { stationInput, type StationInput, type StationRow, type UnitPreference } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { readingUnitLabel } from '../../../lib/units';
import { Choice } from './choice';
import { STATUS_LABEL, converted, milliInput, milliMessage, numberMessage, readingInput, toInteger, toMilli, toReading, wholeMessage } from './typed';

export interface StationFormValues {
  name: string;
  status: StationRow['status'];
  rpm: string;
  adjustUnit: StationRow['adjustUnit'];
  adjustStepMilli: string;
  bandsSource: 'rink' | 'station';
  ownTrueNm: string;
  ownFairNm: string;
  precision: boolean;
}

const FIELDS = ['name', 'status', 'rpm', 'adjustUnit', 'adjustStepMilli', 'ownTrueNm', 'ownFairNm', 'precision'] as const;

function stationFormSchema(unit: UnitPreference) {
  return z
    .object({
      name: z.string(),
      status: z.enum(['active', 'maintenance', 'retired']),
      rpm: z.string(),
      adjustUnit: z.enum(['turns', 'mm']),
      adjustStepMilli: z.string(),
      bandsSource: z.enum(['rink', 'station']),
      ownTrueNm: z.string(),
      ownFairNm: z.string(),
      precision: z.boolean(),
    })
    .transform((v, ctx): z.input<typeof stationInput> => {
      const rpm = converted(toInteger(v.rpm), ctx, 'rpm', wholeMessage);
      const step = converted(toMilli(v.adjustStepMilli), ctx, 'adjustStepMilli', milliMessage);
      const own = v.bandsSource === 'station';
      const ownTrue = own ? converted(toReading(v.ownTrueNm, unit), ctx, 'ownTrueNm', numberMessage) : null;
      const ownFair = own ? converted(toReading(v.ownFairNm, unit), ctx, 'ownFairNm', numberMessage) : null;
      if (rpm === null || step === null || (own && (ownTrue === null || ownFair === null))) return z.NEVER;
      return { name: v.name, status: v.status, rpm, adjustUnit: v.adjustUnit, adjustStepMilli: step, ownTrueNm: ownTrue, ownFairNm: ownFair, precision: v.precision };
    })
    .pipe(stationInput);
}

export function stationFormValues(station: StationRow | null, unit: UnitPreference): StationFormValues {
  return {
    name: station?.name ?? '',
    status: station?.status ?? 'active',
    rpm: station ? String(station.rpm) : '',
    adjustUnit: station?.adjustUnit ?? 'turns',
    adjustStepMilli: station ? milliInput(station.adjustStepMilli) : '0.125',
    bandsSource: station?.ownTrueNm != null && station.ownFairNm != null ? 'station' : 'rink',
    ownTrueNm: station?.ownTrueNm != null ? readingInput(station.ownTrueNm, unit) : '',
    ownFairNm: station?.ownFairNm != null ? readingInput(station.ownFairNm, unit) : '',
    precision: station?.precision ?? false,
  };
}

/** The station's settings; on a new station the level bands are left to the rink's until it has a page of its own. */
export function StationForm({
  unit,
  station,
  withBands,
  submitLabel,
  save,
  onSaved,
}: {
  unit: UnitPreference;
  station: StationRow | null;
  withBands: boolean;
  submitLabel: string;
  save: (input: StationInput) => Promise<StationRow>;
  onSaved?: (saved: StationRow) => void;
}) {
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset, control } = useForm<StationFormValues, unknown, StationInput>({
    resolver: zodResolver(stationFormSchema(unit)),
    defaultValues: stationFormValues(station, unit),
  });
  const adjustUnit = useWatch({ control, name: 'adjustUnit' });
  const bandsSource = useWatch({ control, name: 'bandsSource' });
  const precision = useWatch({ control, name: 'precision' });
  const e = formState.errors;
  const readingUnit = readingUnitLabel(unit);

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const saved = await save(input);
      reset(stationFormValues(station ? saved : null, unit));
      setNote({ tone: 'success', text: station ? 'Station saved.' : `${saved.name} added.` });
      onSaved?.(saved);
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, FIELDS) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Station name" autoComplete="off" error={e.name?.message} {...register('name')} />
        <SelectField label="Status" options={Object.entries(STATUS_LABEL).map(([value, label]) => ({ value, label }))} error={e.status?.message} {...register('status')} />
        <TextField label="Spindle speed (RPM)" inputMode="numeric" className="tabular-nums" hint="From the machine's plate; checked against each wheel's rating." error={e.rpm?.message} {...register('rpm')} />
        <SelectField
          label="Adjusting screw set in"
          options={[
            { value: 'turns', label: 'Turns' },
            { value: 'mm', label: 'Millimetres' },
          ]}
          error={e.adjustUnit?.message}
          {...register('adjustUnit')}
        />
        <TextField
          label={`Smallest step (${adjustUnit === 'mm' ? 'mm' : 'turn'})`}
          inputMode="decimal"
          hint="The leveling advice is rounded to this step, e.g. 0.125."
          error={e.adjustStepMilli?.message}
          {...register('adjustStepMilli')}
        />
      </div>
      {withBands ? (
        <fieldset className="space-y-2 rounded-lg border border-rule p-4">
          <legend className="px-1 text-sm font-bold">Level bands for this station</legend>
          <Choice type="radio" value="rink" label="The rink's level bands" {...register('bandsSource')} />
          <Choice type="radio" value="station" label="Its own level bands" {...register('bandsSource')} />
          {bandsSource === 'station' ? (
            <div className="grid gap-4 pl-8 sm:grid-cols-2">
              <TextField label={`True up to (${readingUnit})`} inputMode="decimal" error={e.ownTrueNm?.message} {...register('ownTrueNm', { deps: ['ownFairNm'] })} />
              <TextField label={`Fair up to (${readingUnit})`} inputMode="decimal" error={e.ownFairNm?.message} {...register('ownFairNm')} />
            </div>
          ) : null}
          <Choice
            label="Precision bands"
            hint={
              precision && bandsSource === 'station'
                ? "While precision is on, the rink's tighter precision limits apply and this station's own bands wait."
                : "Use the rink's tighter precision limits, so that true means closer to zero."
            }
            error={e.precision?.message}
            {...register('precision')}
          />
        </fieldset>
      ) : null}
      <Button type="submit" busy={formState.isSubmitting} disabled={station !== null && !formState.isDirty}>
        {formState.isSubmitting ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
