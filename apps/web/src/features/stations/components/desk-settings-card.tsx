import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { deskSettings, type DeskSettings, type RinkSummary, type UnitPreference } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { Card } from '../../../components/ui/layout';
import { applyServerErrors } from '../../../lib/forms';
import { can } from '../../../lib/rink-context';
import { readingUnitLabel } from '../../../lib/units';
import { useDeskSettings } from '../../../lib/queries/stations';
import { useUpdateDeskSettings } from '../api/update-desk-settings';
import { BandName } from './band-name';
import { converted, limitText, milliInput, milliMessage, numberMessage, readingInput, readingText, toInteger, toMilli, toReading, wholeMessage } from './typed';

type Values = Record<keyof DeskSettings, string>;
const FIELDS = Object.keys(deskSettings.shape) as (keyof DeskSettings)[];
const READING_FIELDS = ['trueNm', 'fairNm', 'precisionTrueNm', 'precisionFairNm', 'defaultResponseNmPerTurn'] as const;

function settingsSchema(unit: UnitPreference) {
  return z
    .object(Object.fromEntries(FIELDS.map((f) => [f, z.string()])) as Record<keyof DeskSettings, z.ZodString>)
    .transform((v, ctx): z.input<typeof deskSettings> => {
      const out: Partial<Record<keyof DeskSettings, number | null>> = {};
      for (const f of READING_FIELDS) out[f] = converted(toReading(v[f], unit), ctx, f, numberMessage);
      out.defaultMinutesPerPair = converted(toInteger(v.defaultMinutesPerPair), ctx, 'defaultMinutesPerPair', wholeMessage);
      out.ewmaLambdaMilli = converted(toMilli(v.ewmaLambdaMilli), ctx, 'ewmaLambdaMilli', milliMessage);
      out.ewmaKMilli = converted(toMilli(v.ewmaKMilli), ctx, 'ewmaKMilli', milliMessage);
      return Object.values(out).includes(null) ? z.NEVER : (out as DeskSettings);
    })
    .pipe(deskSettings);
}

function toValues(s: DeskSettings, unit: UnitPreference): Values {
  return {
    trueNm: readingInput(s.trueNm, unit),
    fairNm: readingInput(s.fairNm, unit),
    precisionTrueNm: readingInput(s.precisionTrueNm, unit),
    precisionFairNm: readingInput(s.precisionFairNm, unit),
    defaultResponseNmPerTurn: readingInput(s.defaultResponseNmPerTurn, unit),
    defaultMinutesPerPair: String(s.defaultMinutesPerPair),
    ewmaLambdaMilli: milliInput(s.ewmaLambdaMilli),
    ewmaKMilli: milliInput(s.ewmaKMilli),
  };
}

/** The rink's limits, for everyone who reads stations; the form only for those who may change them. */
export function DeskSettingsCard({ rink }: { rink: RinkSummary }) {
  const settings = useDeskSettings(rink.slug);
  const unit = rink.unitPreference;
  return (
    <Card title="Level bands and drift watch">
      {settings.isPending ? (
        <Loading />
      ) : settings.isError ? (
        <Alert>{settings.error.message}</Alert>
      ) : can(rink, 'station', 'manage') ? (
        <DeskSettingsForm slug={rink.slug} unit={unit} settings={settings.data} />
      ) : (
        <BandsSummary settings={settings.data} unit={unit} />
      )}
    </Card>
  );
}

function BandsSummary({ settings, unit }: { settings: DeskSettings; unit: UnitPreference }) {
  const rows = [
    { name: 'Level bands', trueNm: settings.trueNm, fairNm: settings.fairNm },
    { name: 'Precision bands', trueNm: settings.precisionTrueNm, fairNm: settings.precisionFairNm },
  ];
  return (
    <div className="space-y-4 text-sm">
      {rows.map((r) => (
        <div key={r.name}>
          <h3 className="font-bold">{r.name}</h3>
          <ul className="mt-1 space-y-1 tabular-nums">
            <li className="flex gap-2">
              <BandName band="true" /> up to ±{limitText(r.trueNm, unit)}
            </li>
            <li className="flex gap-2">
              <BandName band="fair" /> up to ±{limitText(r.fairNm, unit)}
            </li>
            <li className="flex gap-2">
              <BandName band="off" /> beyond ±{limitText(r.fairNm, unit)}
            </li>
          </ul>
        </div>
      ))}
      <p className="text-ink-soft">
        Drift watch: EWMA λ {milliInput(settings.ewmaLambdaMilli)}, limits at L = {milliInput(settings.ewmaKMilli)}. Default response {readingText(settings.defaultResponseNmPerTurn, unit)} per turn.
      </p>
    </div>
  );
}

function DeskSettingsForm({ slug, unit, settings }: { slug: string; unit: UnitPreference; settings: DeskSettings }) {
  const update = useUpdateDeskSettings(slug);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Values, unknown, DeskSettings>({
    resolver: zodResolver(settingsSchema(unit)),
    values: toValues(settings, unit),
  });
  const e = formState.errors;
  const ru = readingUnitLabel(unit);

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const saved = await update.mutateAsync(input);
      reset(toValues(saved, unit));
      setNote({ tone: 'success', text: 'Level bands and drift watch saved.' });
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, FIELDS) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <p className="text-sm text-ink-soft">
        A reading is <strong className="text-ink">true</strong> up to the true limit either side of level, <strong className="text-ink">fair</strong> up to the fair limit, and{' '}
        <strong className="text-ink">off</strong> beyond it. A reading exactly on a limit counts in the better band. Limits are typed in {unit === 'in' ? 'thousandths of an inch' : 'hundredths of a millimetre'}.
      </p>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold">Level bands</legend>
        <TextField label={`True up to ± (${ru})`} inputMode="decimal" error={e.trueNm?.message} {...register('trueNm', { deps: ['fairNm'] })} />
        <TextField label={`Fair up to ± (${ru})`} inputMode="decimal" error={e.fairNm?.message} {...register('fairNm', { deps: ['precisionFairNm'] })} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold">Precision bands (the tighter pair a station can switch to)</legend>
        <TextField label={`Precision true up to ± (${ru})`} inputMode="decimal" error={e.precisionTrueNm?.message} {...register('precisionTrueNm', { deps: ['precisionFairNm'] })} />
        <TextField label={`Precision fair up to ± (${ru})`} inputMode="decimal" error={e.precisionFairNm?.message} {...register('precisionFairNm')} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold">Leveling advice and promised times</legend>
        <TextField
          label={`Default response (${ru} per turn)`}
          inputMode="decimal"
          hint="How far one turn moves the readings, until a station has three adjustments of its own to fit."
          error={e.defaultResponseNmPerTurn?.message}
          {...register('defaultResponseNmPerTurn')}
        />
        <TextField
          label="Default minutes per pair"
          inputMode="numeric"
          hint="Used for promised times until a station has its own history."
          error={e.defaultMinutesPerPair?.message}
          {...register('defaultMinutesPerPair')}
        />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-bold">Drift watch (EWMA chart)</legend>
        <TextField label="Weight of the newest reading, λ" inputMode="decimal" hint="0.05 to 1; smaller follows slow drift, 0.2 is usual." error={e.ewmaLambdaMilli?.message} {...register('ewmaLambdaMilli')} />
        <TextField label="Width of the limits, L" inputMode="decimal" hint="1 to 5 standard deviations; 3 is usual." error={e.ewmaKMilli?.message} {...register('ewmaKMilli')} />
      </fieldset>
      <Button type="submit" busy={formState.isSubmitting} disabled={!formState.isDirty}>
        {formState.isSubmitting ? 'Saving…' : 'Save bands and drift watch'}
      </Button>
    </form>
  );
}
