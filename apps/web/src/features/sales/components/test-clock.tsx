import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { advanceClockInput } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { useAdvanceClock } from '../api/advance-clock';

// An emptied field reaches zod as NaN: say what to type rather than zod's own words.
const schema = z.object({ days: z.number({ error: 'Enter a number of days' }) }).pipe(advanceClockInput);

/** Moves the payment service's test clocks, so a month of renewals can be watched in a minute. */
export function TestClock({ slug }: { slug: string }) {
  const advance = useAdvanceClock(slug);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError } = useForm<z.input<typeof schema>, unknown, z.output<typeof advanceClockInput>>({
    resolver: zodResolver(schema),
    defaultValues: { days: 30 },
  });
  const onSubmit = handleSubmit(async ({ days }) => {
    setNote(null);
    try {
      await advance.mutateAsync(days);
      setNote({ tone: 'success', text: `Test clocks moved ${days} day${days === 1 ? '' : 's'} forward.` });
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['days']) });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Test clock">
      <p className="text-sm text-ink-soft">This exists only with the test payment service: real payments follow the real calendar.</p>
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <TextField label="Advance by (days)" type="number" inputMode="numeric" min={1} max={400} className="max-w-xs tabular-nums" error={formState.errors.days?.message} {...register('days', { valueAsNumber: true })} />
      <Button type="submit" tone="secondary" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Moving the clock…' : 'Advance the test clock'}
      </Button>
    </form>
  );
}
