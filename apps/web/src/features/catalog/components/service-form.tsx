import { zodResolver } from '@hookform/resolvers/zod';
import { forwardRef, useId, useState, type InputHTMLAttributes } from 'react';
import { useForm } from 'react-hook-form';
import { serviceInput, type ServiceInput, type ServiceRow } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { minorDigits, moneyInput, parseMoney } from '../../../lib/format';

export const KIND_LABEL: Record<ServiceRow['kind'], string> = {
  standard: 'Standard sharpening',
  profiling: 'Profiling',
  new_steel: 'New steel',
  add_on: 'Add-on',
};

interface Values {
  name: string;
  kind: ServiceRow['kind'];
  priceMinor: string;
  active: boolean;
}

const schema = (currency: string) =>
  z
    .object({ name: z.string(), kind: z.enum(['standard', 'profiling', 'new_steel', 'add_on']), priceMinor: z.string(), active: z.boolean() })
    .transform((v, ctx): z.input<typeof serviceInput> => {
      const price = parseMoney(v.priceMinor, currency);
      if (price === null) {
        const digits = minorDigits(currency);
        ctx.addIssue({ code: 'custom', message: digits === 0 ? 'Enter a whole amount, e.g. 1200' : `Enter an amount such as 12.${'5'.padEnd(digits, '0')}`, path: ['priceMinor'] });
        return z.NEVER;
      }
      return { ...v, priceMinor: price };
    })
    .pipe(serviceInput);

const valuesOf = (service: ServiceRow | null, currency: string): Values => ({
  name: service?.name ?? '',
  kind: service?.kind ?? 'standard',
  priceMinor: service ? moneyInput(service.priceMinor, currency) : '',
  active: service?.active ?? true,
});

const Checkbox = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { label: string; hint: string }>(function Checkbox({ label, hint, ...rest }, ref) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="flex min-h-11 cursor-pointer items-center gap-3 text-sm font-semibold">
        <input ref={ref} id={id} type="checkbox" className="size-5 accent-steel" aria-describedby={`${id}-hint`} {...rest} />
        {label}
      </label>
      <p id={`${id}-hint`} className="ml-8 text-sm text-ink-soft">
        {hint}
      </p>
    </div>
  );
});

export function ServiceForm({
  service,
  currency,
  save,
  onDone,
}: {
  service: ServiceRow | null;
  currency: string;
  save: (input: ServiceInput) => Promise<ServiceRow>;
  onDone?: (saved: ServiceRow) => void;
}) {
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Values, unknown, ServiceInput>({
    resolver: zodResolver(schema(currency)),
    defaultValues: valuesOf(service, currency),
  });
  const e = formState.errors;

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const saved = await save(input);
      if (service) {
        onDone?.(saved);
      } else {
        reset(valuesOf(null, currency));
        setNote({ tone: 'success', text: `${saved.name} added.` });
        onDone?.(saved);
      }
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, ['name', 'kind', 'priceMinor', 'active']) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={service ? `Change ${service.name}` : 'Add a service'}>
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <TextField label="Service name" autoComplete="off" autoFocus={service !== null} error={e.name?.message} {...register('name')} />
      <SelectField label="Kind" options={Object.entries(KIND_LABEL).map(([value, label]) => ({ value, label }))} error={e.kind?.message} {...register('kind')} />
      <TextField
        label={`Price (${currency})`}
        inputMode="decimal"
        autoComplete="off"
        className="tabular-nums"
        hint="Per pair, as charged at the counter."
        error={e.priceMinor?.message}
        {...register('priceMinor')}
      />
      <Checkbox label="Offered at the counter" hint="Untick to stop offering it; past tickets keep it." {...register('active')} />
      <Button type="submit" busy={formState.isSubmitting} disabled={service !== null && !formState.isDirty}>
        {formState.isSubmitting ? 'Saving…' : service ? 'Save service' : 'Add service'}
      </Button>
    </form>
  );
}
