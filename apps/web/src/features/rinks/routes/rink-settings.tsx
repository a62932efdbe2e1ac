import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { updateRinkInput, type UpdateRinkInput } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { applyServerErrors } from '../../../lib/forms';
import { can, useRink } from '../../../lib/rink-context';
import { useUpdateRink } from '../api/update-rink';
import { RinkDetailFields } from '../components/rink-fields';

type Values = Required<UpdateRinkInput>;

export function Component() {
  const rink = useRink();
  const update = useUpdateRink(rink.slug);
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Values>({
    resolver: zodResolver(updateRinkInput.required()),
    values: { name: rink.name, timeZone: rink.timeZone, currency: rink.currency, unitPreference: rink.unitPreference },
  });
  if (!can(rink, 'rink', 'update')) return <NotFound />;

  const onSubmit = handleSubmit(async (values) => {
    setNote(null);
    try {
      const saved = await update.mutateAsync(values);
      reset({ name: saved.name, timeZone: saved.timeZone, currency: saved.currency, unitPreference: saved.unitPreference });
      setNote({ tone: 'success', text: 'Settings saved.' });
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['name', 'timeZone', 'currency', 'unitPreference']) });
    }
  });

  return (
    <div className="max-w-xl">
      <PageHeader title="Rink settings" subtitle={`Address: /r/${rink.slug}`} />
      <Card>
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
          <TextField label="Rink name" error={formState.errors.name?.message} {...register('name')} />
          <RinkDetailFields register={register} errors={formState.errors} />
          <Button type="submit" busy={formState.isSubmitting} disabled={!formState.isDirty}>
            {formState.isSubmitting ? 'Saving…' : 'Save settings'}
          </Button>
        </form>
      </Card>
    </div>
  );
}
