import { zodResolver } from '@hookform/resolvers/zod';
import { useId, useState } from 'react';
import { useForm, type UseFormRegisterReturn } from 'react-hook-form';
import { preferencesInput, type PreferencesInput } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { applyServerErrors } from '../../../lib/forms';
import { useSavePreferences } from '../api/save-preferences';

function Choice({ label, hint, field }: { label: string; hint: string; field: UseFormRegisterReturn }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-center gap-3 text-sm font-semibold">
        <input id={id} type="checkbox" className="size-5 accent-steel" aria-describedby={`${id}-hint`} {...field} />
        {label}
      </label>
      <p id={`${id}-hint`} className="ml-8 text-sm text-ink-soft">
        {hint}
      </p>
    </div>
  );
}

export function PreferencesForm({ slug, preferences }: { slug: string; preferences: PreferencesInput }) {
  const save = useSavePreferences(slug);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<PreferencesInput>({ resolver: zodResolver(preferencesInput), defaultValues: preferences });

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      reset(await save.mutateAsync(input));
      setNote({ tone: 'success', text: 'Saved.' });
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['notifyReady', 'notifyReminders']) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="E-mail from this rink">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <Choice label="Tell me when my skates are ready" hint="One e-mail when the counter marks your ticket ready." field={register('notifyReady')} />
      <Choice label="Remind me before credits expire or run low" hint="A reminder before a lot expires, and when your balance is nearly used up." field={register('notifyReminders')} />
      <p className="text-sm text-ink-soft">Receipts for payments and refunds are always sent.</p>
      <Button type="submit" busy={formState.isSubmitting} disabled={!formState.isDirty}>
        {formState.isSubmitting ? 'Saving…' : 'Save choices'}
      </Button>
    </form>
  );
}
