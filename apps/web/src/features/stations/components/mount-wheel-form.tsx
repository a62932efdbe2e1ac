import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { mountWheelInput, type MountWheelInput, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { lengthUnitLabel, parseLength } from '../../../lib/units';
import { useActionKey } from '../api/idempotency';
import { useMountWheel } from '../api/mount-wheel';
import { Choice } from './choice';
import { HollowPicker, hollowDefaults, pickedHollow } from './hollow-picker';
import { SafetyCautions } from './safety-cautions';
import { converted, numberMessage, toInteger, wholeMessage, wholeNumber } from './typed';
import { upkeepProblem } from './upkeep-note';

interface Values {
  label: string;
  grit: string;
  diameterNewNm: string;
  minDiameterNm: string;
  ratedMaxRpm: string;
  hollowPick: string;
  hollowNm: string;
  ringTested: boolean;
}

const FIELDS = ['label', 'grit', 'diameterNewNm', 'minDiameterNm', 'ratedMaxRpm', 'hollowNm', 'ringTested'] as const;

const schema = (unit: UnitPreference) =>
  z
    .object({
      label: z.string(),
      grit: z.string(),
      diameterNewNm: z.string(),
      minDiameterNm: z.string(),
      ratedMaxRpm: z.string(),
      hollowPick: z.string(),
      hollowNm: z.string(),
      ringTested: z.boolean(),
    })
    .transform((v, ctx): z.input<typeof mountWheelInput> => {
      const out = {
        grit: converted(toInteger(v.grit), ctx, 'grit', wholeMessage),
        diameterNewNm: converted(parseLength(v.diameterNewNm, unit), ctx, 'diameterNewNm', numberMessage),
        minDiameterNm: converted(parseLength(v.minDiameterNm, unit), ctx, 'minDiameterNm', numberMessage),
        ratedMaxRpm: converted(toInteger(v.ratedMaxRpm), ctx, 'ratedMaxRpm', wholeMessage),
        hollowNm: converted(pickedHollow(v, unit), ctx, 'hollowNm', numberMessage),
      };
      if (Object.values(out).includes(null)) {
        // The ring test is the one that matters most, so its message shows with the others, not after them.
        if (!v.ringTested) ctx.addIssue({ code: 'custom', message: 'Ring-test and inspect the wheel before mounting it', path: ['ringTested'] });
        return z.NEVER;
      }
      // Passed on as typed, so that the shared schema refuses an unticked box with its own message.
      return { label: v.label, ringTested: v.ringTested as true, ...(out as Record<keyof typeof out, number>) };
    })
    .pipe(mountWheelInput);

const EMPTY = (unit: UnitPreference): Values => ({ label: '', grit: '', diameterNewNm: '', minDiameterNm: '', ratedMaxRpm: '', ...hollowDefaults(null, unit), ringTested: false });

export function MountWheelForm({ slug, detail, unit }: { slug: string; detail: StationDetail; unit: UnitPreference }) {
  const station = detail.station;
  const mount = useMountWheel(slug, station.id);
  const actionKey = useActionKey();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset, control } = useForm<Values, unknown, MountWheelInput>({
    resolver: zodResolver(schema(unit)),
    defaultValues: EMPTY(unit),
  });
  const pick = useWatch({ control, name: 'hollowPick' });
  const rated = toInteger(useWatch({ control, name: 'ratedMaxRpm' }) ?? '');
  const tooFast = rated !== null && rated > 0 && station.rpm > rated;
  const e = formState.errors;
  const lu = lengthUnitLabel(unit);

  const [open, setOpen] = useState(station.wheel === null);

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      await mount.mutateAsync({ input, key: actionKey.keyFor(input) });
      actionKey.settle();
      reset(EMPTY(unit));
      setOpen(false);
      setNote({ tone: 'success', text: `${input.label} mounted. Stand aside from the wheel for its first start-up.` });
    } catch (error) {
      setNote({ tone: 'error', text: upkeepProblem(error, setError, FIELDS) });
    }
  });

  if (!open) {
    return (
      <div className="space-y-4">
        {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
        <p className="text-sm text-ink-soft">
          {station.wheel ? `${station.wheel.label} is mounted. Mounting a new wheel logs it as removed.` : 'No wheel mounted.'}
        </p>
        <Button tone="secondary" onClick={() => setOpen(true)}>
          Mount a new wheel
        </Button>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Mount a wheel">
      <SafetyCautions work="mount" />
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      {station.wheel ? <p className="text-sm text-ink-soft">The wheel now mounted, {station.wheel.label}, is logged as removed when this one is mounted.</p> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Wheel name" autoComplete="off" hint="As you tell your wheels apart, e.g. its batch or shelf label." error={e.label?.message} {...register('label')} />
        <TextField label="Grit" inputMode="numeric" autoComplete="off" error={e.grit?.message} {...register('grit')} />
        <TextField label={`Diameter new (${lu})`} inputMode="decimal" autoComplete="off" error={e.diameterNewNm?.message} {...register('diameterNewNm', { deps: ['minDiameterNm'] })} />
        <TextField label={`Minimum diameter (${lu})`} inputMode="decimal" autoComplete="off" hint="From the machine maker's manual." error={e.minDiameterNm?.message} {...register('minDiameterNm')} />
        <TextField
          label="Rated maximum speed (RPM)"
          inputMode="numeric"
          autoComplete="off"
          hint={`As marked on the wheel. This station runs at ${wholeNumber(station.rpm)} RPM.`}
          error={e.ratedMaxRpm?.message}
          {...register('ratedMaxRpm')}
        />
        <HollowPicker register={register} errors={e} pick={pick} unit={unit} label="Dressed to the hollow" />
      </div>
      {tooFast ? (
        <Alert>
          This wheel is rated for {wholeNumber(rated)} RPM but the station runs at {wholeNumber(station.rpm)} RPM. Do not mount it: a wheel must never run above its rated speed.
        </Alert>
      ) : null}
      <Choice label="I ring-tested and inspected this wheel" hint="Required. Look the wheel over for cracks and chips; hang it on its bore, tap it gently with a non-metallic tool and listen for a clear ring, as the wheel maker describes." error={e.ringTested?.message} {...register('ringTested')} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={formState.isSubmitting} disabled={tooFast}>
          {formState.isSubmitting ? 'Mounting…' : 'Mount wheel'}
        </Button>
        {station.wheel ? (
          <Button tone="quiet" onClick={() => setOpen(false)}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
