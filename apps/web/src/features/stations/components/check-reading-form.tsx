import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { checkReadingInput, classifyLevel, type CheckReadingInput, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { LevelScale } from '../../../components/ui/level-reading';
import { parseReading, readingUnitLabel } from '../../../lib/units';
import { useActionKey } from '../api/idempotency';
import { useLogCheckReading } from '../api/log-check-reading';
import { converted, numberMessage, readingText } from './typed';
import { upkeepProblem } from './upkeep-note';

interface Values {
  blade: 'left' | 'right';
  readingNm: string;
}

const schema = (unit: UnitPreference) =>
  z
    .object({ blade: z.enum(['left', 'right']), readingNm: z.string() })
    .transform((v, ctx): z.input<typeof checkReadingInput> => {
      const reading = converted(parseReading(v.readingNm, unit), ctx, 'readingNm', numberMessage);
      return reading === null ? z.NEVER : { blade: v.blade, readingNm: reading };
    })
    .pipe(checkReadingInput);

export function CheckReadingForm({ slug, detail, unit }: { slug: string; detail: StationDetail; unit: UnitPreference }) {
  const log = useLogCheckReading(slug, detail.station.id);
  const actionKey = useActionKey();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset, control, setFocus } = useForm<Values, unknown, CheckReadingInput>({
    resolver: zodResolver(schema(unit)),
    defaultValues: { blade: 'left', readingNm: '' },
  });
  const typed = useWatch({ control, name: 'readingNm' });
  const preview = parseReading(typed ?? '', unit);

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      await log.mutateAsync({ input, key: actionKey.keyFor(input) });
      actionKey.settle();
      reset({ blade: input.blade, readingNm: '' });
      setNote({ tone: 'success', text: `Check reading logged: ${readingText(input.readingNm, unit)}, ${classifyLevel(input.readingNm, detail.bands)}.` });
      setFocus('readingNm');
    } catch (error) {
      setNote({ tone: 'error', text: upkeepProblem(error, setError, ['blade', 'readingNm']) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Log a check reading">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <SelectField
          label="Blade"
          options={[
            { value: 'left', label: 'Left blade' },
            { value: 'right', label: 'Right blade' },
          ]}
          error={formState.errors.blade?.message}
          {...register('blade')}
        />
        <TextField
          label={`Level reading (${readingUnitLabel(unit)})`}
          inputMode="decimal"
          autoComplete="off"
          className="tabular-nums"
          hint="Signed: + when the right-hand edge is high."
          error={formState.errors.readingNm?.message}
          {...register('readingNm')}
        />
      </div>
      {preview !== null ? (
        <div className="rounded-lg bg-frost p-3" aria-live="polite">
          <LevelScale readingNm={preview} bands={detail.bands} unit={unit} />
        </div>
      ) : null}
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Logging…' : 'Log check reading'}
      </Button>
    </form>
  );
}
