import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { adjustmentInput, type AdjustmentInput, type StationDetail } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { useActionKey } from '../api/idempotency';
import { useLogAdjustment } from '../api/log-adjustment';
import { advisedMilli } from './leveling-advice';
import { adjustText, converted, milliInput, milliMessage, toMilli } from './typed';
import { upkeepProblem } from './upkeep-note';

interface Values {
  amountMilli: string;
  note: string;
}

const schema = (stepMilli: number, unitWord: string) =>
  z
    .object({ amountMilli: z.string(), note: z.string() })
    .transform((v, ctx): z.input<typeof adjustmentInput> => {
      const amount = converted(toMilli(v.amountMilli), ctx, 'amountMilli', milliMessage);
      if (amount === null) return z.NEVER;
      // The screw is set in whole steps; a part step cannot be made, so it cannot be logged as made.
      if (amount % stepMilli !== 0) {
        ctx.addIssue({ code: 'custom', message: `Use whole steps of ${milliInput(stepMilli)} ${unitWord}`, path: ['amountMilli'] });
        return z.NEVER;
      }
      return { amountMilli: amount, note: v.note.trim() === '' ? undefined : v.note };
    })
    .pipe(adjustmentInput);

export function AdjustmentForm({ slug, detail }: { slug: string; detail: StationDetail }) {
  const station = detail.station;
  const unitWord = station.adjustUnit === 'mm' ? 'mm' : 'turn';
  const log = useLogAdjustment(slug, station.id);
  const actionKey = useActionKey();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset, setValue } = useForm<Values, unknown, AdjustmentInput>({
    resolver: zodResolver(schema(station.adjustStepMilli, unitWord)),
    defaultValues: { amountMilli: '', note: '' },
  });
  const advised = advisedMilli(detail);

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      await log.mutateAsync({ input, key: actionKey.keyFor(input) });
      actionKey.settle();
      reset({ amountMilli: '', note: '' });
      setNote({ tone: 'success', text: `Adjustment logged: ${adjustText(input.amountMilli, station.adjustUnit)}. Take a few check readings to confirm it.` });
    } catch (error) {
      setNote({ tone: 'error', text: upkeepProblem(error, setError, ['amountMilli', 'note']) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Log a leveling adjustment">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <TextField
        label={`Adjustment made (${station.adjustUnit === 'mm' ? 'mm' : 'turns of the adjusting screw'})`}
        inputMode="decimal"
        autoComplete="off"
        className="tabular-nums"
        hint={`Signed, in steps of ${milliInput(station.adjustStepMilli)} ${unitWord}: + and − in the same sense as the leveling advice.`}
        error={formState.errors.amountMilli?.message}
        {...register('amountMilli')}
      />
      {advised !== null ? (
        <Button tone="quiet" onClick={() => setValue('amountMilli', (advised > 0 ? '+' : '') + milliInput(advised), { shouldDirty: true, shouldValidate: true })}>
          Fill in the advised {adjustText(advised, station.adjustUnit)}
        </Button>
      ) : null}
      <TextField label="Note (optional)" autoComplete="off" error={formState.errors.note?.message} {...register('note')} />
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Logging…' : 'Log adjustment'}
      </Button>
    </form>
  );
}
