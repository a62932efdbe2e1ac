import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { creditAdjustmentInput, type CreditAdjustmentInput } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { formatCount } from '../../../lib/format';
import { applyServerErrors } from '../../../lib/forms';
import { useAdjustCredits } from '../api/adjust-credits';
import { signed } from './words';

// An empty or non-numeric field reaches zod as NaN: say what to type rather than zod's own words.
const schema = z.object({ credits: z.number({ error: 'Enter a number of credits, e.g. 2 or -2' }), reason: z.string() }).pipe(creditAdjustmentInput);

/** A manager grants or removes credits; the reason goes into the ledger beside the entry. */
export function AdjustForm({ slug, customerId, customerName }: { slug: string; customerId: string; customerName: string }) {
  const adjust = useAdjustCredits(slug, customerId);
  const [note, setNote] = useState<{ tone: 'error' | 'success' | 'info'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<z.input<typeof schema>, unknown, CreditAdjustmentInput>({
    resolver: zodResolver(schema),
    defaultValues: { reason: '' },
  });
  const e = formState.errors;
  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const outcome = await adjust.mutateAsync({ input, label: `Adjust ${customerName}'s credits by ${signed(input.credits)}` });
      reset({ reason: '' });
      setNote(
        outcome.queued
          ? { tone: 'info', text: 'Saved on this tablet: the adjustment goes out as soon as the connection is back.' }
          : { tone: 'success', text: `Credits adjusted by ${signed(input.credits)}. Balance after the adjustment: ${formatCount(outcome.result.balance)}.` },
      );
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['credits', 'reason']) });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Adjust credits">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <TextField
        label="Credits"
        type="number"
        inputMode="numeric"
        step={1}
        className="tabular-nums"
        hint="Positive adds credits, negative (e.g. -2) removes them."
        error={e.credits?.message}
        {...register('credits', { valueAsNumber: true })}
      />
      <TextField label="Reason" autoComplete="off" hint="Kept in the ledger for everyone to see." error={e.reason?.message} {...register('reason')} />
      <Button type="submit" tone="secondary" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Saving…' : 'Adjust credits'}
      </Button>
    </form>
  );
}
