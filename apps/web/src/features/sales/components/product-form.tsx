import { zodResolver } from '@hookform/resolvers/zod';
import { forwardRef, useId, useState, type InputHTMLAttributes } from 'react';
import { useForm } from 'react-hook-form';
import { PRODUCT_KIND_LABELS, PRODUCT_KINDS, productInput, type ProductInput, type ProductKind, type ProductRow } from '@rinkwright/core';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { minorDigits, moneyInput, parseMoney } from '../../../lib/format';
import { applyServerErrors } from '../../../lib/forms';

interface Values {
  kind: ProductKind;
  name: string;
  description: string;
  credits: string;
  priceMinor: string;
  monthsValid: string;
  interval: 'month' | 'year';
  rolloverCap: string;
  graceDays: string;
  listed: boolean;
}

const FIELDS = ['kind', 'name', 'description', 'credits', 'priceMinor', 'monthsValid', 'rolloverCap', 'graceDays', 'interval', 'listed'] as const;

const wholeOrNull = (t: string) => (t.trim() === '' ? null : Number(t));

/** The typed values, turned into the route's own schema: only a membership sends its renewal fields. */
const schema = (currency: string) =>
  z
    .object({
      kind: z.enum(PRODUCT_KINDS),
      name: z.string(),
      description: z.string(),
      credits: z.string(),
      priceMinor: z.string(),
      monthsValid: z.string(),
      interval: z.enum(['month', 'year']),
      rolloverCap: z.string(),
      graceDays: z.string(),
      listed: z.boolean(),
    })
    .transform((v, ctx): z.input<typeof productInput> => {
      const price = parseMoney(v.priceMinor, currency);
      if (price === null) {
        const digits = minorDigits(currency);
        ctx.addIssue({ code: 'custom', path: ['priceMinor'], message: digits === 0 ? 'Enter a whole amount, e.g. 1200' : `Enter an amount such as 45.${'0'.padEnd(digits, '0')}` });
        return z.NEVER;
      }
      const membership = v.kind === 'membership';
      return {
        kind: v.kind,
        name: v.name,
        description: v.description.trim() === '' ? null : v.description,
        credits: Number(v.credits),
        priceMinor: price,
        monthsValid: membership ? null : wholeOrNull(v.monthsValid),
        interval: membership ? v.interval : null,
        rolloverCap: membership ? wholeOrNull(v.rolloverCap) : null,
        graceDays: membership ? wholeOrNull(v.graceDays) : null,
        listed: v.listed,
      };
    })
    .pipe(productInput);

const valuesOf = (p: ProductRow | null, currency: string): Values => ({
  kind: p?.kind ?? 'punch_card',
  name: p?.name ?? '',
  description: p?.description ?? '',
  credits: p ? String(p.credits) : '10',
  priceMinor: p ? moneyInput(p.price.amountMinor, currency) : '',
  monthsValid: p?.monthsValid ? String(p.monthsValid) : '',
  interval: p?.interval ?? 'month',
  rolloverCap: p?.rolloverCap !== null && p?.rolloverCap !== undefined ? String(p.rolloverCap) : '',
  graceDays: p?.graceDays !== null && p?.graceDays !== undefined ? String(p.graceDays) : '',
  listed: p?.listed ?? true,
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

export function ProductForm({
  product,
  currency,
  save,
  onDone,
}: {
  product: ProductRow | null;
  currency: string;
  save: (input: ProductInput) => Promise<ProductRow>;
  onDone?: (saved: ProductRow) => void;
}) {
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset, watch } = useForm<Values, unknown, ProductInput>({
    resolver: zodResolver(schema(currency)),
    defaultValues: valuesOf(product, currency),
  });
  const e = formState.errors;
  const kind = watch('kind');

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    try {
      const saved = await save(input);
      if (!product) {
        reset(valuesOf(null, currency));
        setNote({ tone: 'success', text: `${saved.name} added.${saved.synced ? '' : ' It goes on the payout account once that is connected.'}` });
      }
      onDone?.(saved);
    } catch (error) {
      setNote({ tone: 'error', text: applyServerErrors(error, setError, FIELDS) });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={product ? `Change ${product.name}` : 'Add a product'}>
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <SelectField label="Kind" options={PRODUCT_KINDS.map((k) => ({ value: k, label: PRODUCT_KIND_LABELS[k] }))} error={e.kind?.message} {...register('kind')} />
      <TextField label="Name" autoComplete="off" error={e.name?.message} {...register('name')} />
      <TextField label="Description (optional)" autoComplete="off" error={e.description?.message} {...register('description')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField
          label={kind === 'membership' ? 'Credits per period' : 'Credits'}
          inputMode="numeric"
          className="tabular-nums"
          hint="One credit is one standard sharpening of a pair."
          error={e.credits?.message}
          {...register('credits')}
        />
        <TextField
          label={`Price (${currency})`}
          inputMode="decimal"
          autoComplete="off"
          className="tabular-nums"
          hint={product ? 'A new price becomes a new version; past sales keep theirs.' : kind === 'membership' ? 'Charged every period.' : undefined}
          error={e.priceMinor?.message}
          {...register('priceMinor')}
        />
      </div>
      {kind === 'membership' ? (
        <div className="grid gap-4 sm:grid-cols-3">
          <SelectField
            label="Renews every"
            options={[
              { value: 'month', label: 'Month' },
              { value: 'year', label: 'Year' },
            ]}
            error={e.interval?.message}
            {...register('interval')}
          />
          <TextField label="Rollover cap" inputMode="numeric" className="tabular-nums" hint="Unused credits carried into the next period, at most." error={e.rolloverCap?.message} {...register('rolloverCap')} />
          <TextField label="Grace days" inputMode="numeric" className="tabular-nums" hint="Credits stay usable this long after a failed payment." error={e.graceDays?.message} {...register('graceDays')} />
        </div>
      ) : (
        <TextField label="Months to use (optional)" inputMode="numeric" className="tabular-nums" hint="Leave empty for credits that never expire." error={e.monthsValid?.message} {...register('monthsValid')} />
      )}
      <Checkbox label="Listed on the rink's page" hint="Untick to sell it only at the counter (or, for league packs, to leagues)." {...register('listed')} />
      {/* An explicit disabled wins over busy in Button: the submitting state is folded in, or a second press adds the product twice. */}
      <Button type="submit" busy={formState.isSubmitting} disabled={formState.isSubmitting || (product !== null && !formState.isDirty)}>
        {formState.isSubmitting ? 'Saving…' : product ? 'Save product' : 'Add product'}
      </Button>
    </form>
  );
}
