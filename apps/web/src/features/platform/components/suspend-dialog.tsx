import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { suspensionInput, type PlatformRinkRow } from '@rinkwright/core';
import type { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { useSuspendRink } from '../api/suspend-rink';

/** Asks why before suspending a rink, and says plainly what a suspension does to its staff and its skaters. */
export function SuspendDialog({ rink, onClose }: { rink: PlatformRinkRow; onClose: (done: string | null) => void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const suspend = useSuspendRink();
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState, setError } = useForm<z.input<typeof suspensionInput>, unknown, z.output<typeof suspensionInput>>({
    resolver: zodResolver(suspensionInput),
    defaultValues: { reason: '' },
  });

  useEffect(() => {
    dialog.current?.showModal();
  }, []);

  const onSubmit = handleSubmit(async (input) => {
    setProblem('');
    try {
      await suspend.mutateAsync({ rinkId: rink.id, input });
      onClose(`${rink.name} is suspended. Its staff see your reason on every page until you reactivate it.`);
    } catch (error) {
      setProblem(applyServerErrors(error, setError, ['reason']));
    }
  });

  const titleId = `suspend-${rink.id}`;
  return (
    <dialog
      ref={dialog}
      aria-labelledby={titleId}
      className="m-auto w-full max-w-lg rounded-xl border border-rule bg-white p-6 text-ink shadow-lg backdrop:bg-ink/40"
      onCancel={() => onClose(null)}
    >
      <h2 id={titleId} className="mb-3 text-lg font-bold">
        Suspend {rink.name}
      </h2>
      <div className="mb-4 rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm text-ink">
        <p className="font-semibold">Until you reactivate it, {rink.name}’s staff lose access to the rink: the counter, stations, sales, reports and settings all answer with your reason instead.</p>
        <p className="mt-2">Its public page and online checkout close too. Nothing is deleted: its skaters keep their credits, and its records stay as they are.</p>
      </div>
      <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label={`Suspend ${rink.name}`}>
        <Alert>{problem}</Alert>
        <TextField
          label="Reason"
          autoComplete="off"
          autoFocus
          maxLength={300}
          hint={`${rink.name}’s staff read this. 3 to 300 characters.`}
          error={formState.errors.reason?.message}
          {...register('reason')}
        />
        <div className="flex flex-wrap gap-2">
          <Button type="submit" tone="danger" busy={formState.isSubmitting}>
            {formState.isSubmitting ? 'Suspending…' : `Suspend ${rink.name}`}
          </Button>
          <Button tone="secondary" onClick={() => onClose(null)}>
            Keep it open
          </Button>
        </div>
      </form>
    </dialog>
  );
}
