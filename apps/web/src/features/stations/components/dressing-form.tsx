import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { dressingInput, type DressingInput, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { lengthInput, lengthUnitLabel, parseLength, showLength } from '../../../lib/units';
import { useDressWheel } from '../api/dress-wheel';
import { useActionKey } from '../api/idempotency';
import { HollowPicker, hollowDefaults, pickedHollow } from './hollow-picker';
import { SafetyCautions } from './safety-cautions';
import { converted, numberMessage } from './typed';
import { upkeepProblem } from './upkeep-note';

interface Values {
  hollowPick: string;
  hollowNm: string;
  diameterNm: string;
  note: string;
}

const schema = (unit: UnitPreference) =>
  z
    .object({ hollowPick: z.string(), hollowNm: z.string(), diameterNm: z.string(), note: z.string() })
    .transform((v, ctx): z.input<typeof dressingInput> => {
      const hollow = converted(pickedHollow(v, unit), ctx, 'hollowNm', numberMessage);
      const diameter = converted(parseLength(v.diameterNm, unit), ctx, 'diameterNm', numberMessage);
      if (hollow === null || diameter === null) return z.NEVER;
      return { hollowNm: hollow, diameterNm: diameter, note: v.note.trim() === '' ? undefined : v.note };
    })
    .pipe(dressingInput);

export function DressingForm({ slug, detail, unit }: { slug: string; detail: StationDetail; unit: UnitPreference }) {
  const wheel = detail.station.wheel;
  const dress = useDressWheel(slug, detail.station.id);
  const actionKey = useActionKey();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const start = (): Values => ({ ...hollowDefaults(wheel?.hollowNm, unit), diameterNm: lengthInput(wheel?.diameterNm, unit, 'diameter'), note: '' });
  const { register, handleSubmit, formState, setError, reset, control } = useForm<Values, unknown, DressingInput>({
    resolver: zodResolver(schema(unit)),
    defaultValues: start(),
  });
  const pick = useWatch({ control, name: 'hollowPick' });

  if (!wheel) return <p className="text-sm text-ink-soft">Mount a wheel before logging a dressing.</p>;

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const saved = await dress.mutateAsync({ input, key: actionKey.keyFor(input) });
      actionKey.settle();
      reset({ ...hollowDefaults(input.hollowNm, unit), diameterNm: lengthInput(saved.wheel?.diameterNm ?? input.diameterNm, unit, 'diameter'), note: '' });
      setNote({ tone: 'success', text: `Dressing logged: ${showLength(input.hollowNm, unit, 'hollow')} hollow, ${showLength(input.diameterNm, unit, 'diameter')} after.` });
    } catch (error) {
      setNote({ tone: 'error', text: upkeepProblem(error, setError, ['hollowNm', 'diameterNm', 'note']) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Log a dressing">
      <SafetyCautions work="dress" />
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <HollowPicker register={register} errors={formState.errors} pick={pick} unit={unit} label="Dressed to the hollow" />
        <TextField
          label={`Diameter after dressing (${lengthUnitLabel(unit)})`}
          inputMode="decimal"
          autoComplete="off"
          className="tabular-nums"
          hint={`Measured after dressing; it was ${showLength(wheel.diameterNm, unit, 'diameter')}.`}
          error={formState.errors.diameterNm?.message}
          {...register('diameterNm')}
        />
      </div>
      <TextField label="Note (optional)" autoComplete="off" error={formState.errors.note?.message} {...register('note')} />
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Logging…' : 'Log dressing'}
      </Button>
    </form>
  );
}
