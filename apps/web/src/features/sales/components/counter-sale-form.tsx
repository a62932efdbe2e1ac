import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { counterSaleInput, PRODUCT_KIND_LABELS, TEST_PAYMENT_METHODS, type CounterSaleInput, type RinkSummary } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { SelectField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { formatCount, formatMoney } from '../../../lib/format';
import { applyServerErrors } from '../../../lib/forms';
import { can } from '../../../lib/rink-context';
import { useBilling } from '../api/get-billing';
import { useProducts } from '../api/get-products';
import { usePressKey } from '../api/press-key';
import { useSellAtCounter } from '../api/sell-at-counter';
import { validityWords } from './words';

const SOLD_AT_COUNTER = new Set(['punch_card', 'single']);

// The route's schema, with the words for an untouched product picker in front of it.
const schema = z.object({ productId: z.string().min(1, 'Choose a product'), paymentMethodId: z.string() }).pipe(counterSaleInput);

/** Sell a punch card or a single sharpening across the counter, for cash or (in test mode) a test card. */
export function CounterSaleForm({ rink, customerId }: { rink: RinkSummary; customerId: string }) {
  const products = useProducts(rink.slug);
  // Technicians cannot read billing; for them the test cards stay on offer and the API refuses them outside test mode.
  const billing = useBilling(rink.slug, can(rink, 'billing', 'read'));
  const sell = useSellAtCounter(rink.slug, customerId);
  const press = usePressKey();
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<CounterSaleInput>({
    resolver: zodResolver(schema),
    defaultValues: { productId: '', paymentMethodId: 'cash' },
  });
  const e = formState.errors;
  const sellable = (products.data?.products ?? []).filter((p) => p.active && SOLD_AT_COUNTER.has(p.kind));
  const offerTestCards = billing.data ? billing.data.testMode : true;
  const methods = [
    { value: 'cash', label: 'Cash' },
    ...(offerTestCards ? Object.entries(TEST_PAYMENT_METHODS).map(([value, label]) => ({ value, label: `${label} (test card)` })) : []),
  ];

  const onSubmit = handleSubmit(async (input) => {
    setNote(null);
    const key = press.take();
    try {
      const sale = await sell.mutateAsync({ input, key });
      press.done();
      // The picker goes back to empty, so a second press of Sell cannot sell the same card again by accident.
      reset({ productId: '', paymentMethodId: input.paymentMethodId });
      setNote({ tone: 'success', text: `${sale.payment.productName} sold for ${formatMoney(sale.payment.amountMinor, sale.payment.currency)}. Balance after the sale: ${formatCount(sale.balance)}.` });
    } catch (error) {
      // A lost answer may still have charged: keep the key so pressing again repeats this same sale, not a second one.
      const lost = error instanceof ApiError && (error.code === 'network' || error.status >= 500);
      if (!lost) press.done();
      const text = applyServerErrors(error, setError, ['productId', 'paymentMethodId']);
      setNote({ tone: 'error', text: lost ? `${text} Press Sell again to retry the same sale; it cannot be charged twice.` : text });
    }
  });

  if (products.isPending) return <Loading />;
  if (products.isError) return <Alert>{products.error.message}</Alert>;
  if (sellable.length === 0) return <p className="text-ink-soft">No punch card or single sharpening is on sale. A manager adds them under Products.</p>;
  const fieldChanged = { onChange: () => press.done() };
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Sell at the counter">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <SelectField
        label="Product"
        options={[
          { value: '', label: 'Choose a product' },
          // The price comes right after the name: a narrow picker cuts the end of the line, never the price.
          ...sellable.map((p) => ({ value: p.id, label: `${p.name} · ${formatMoney(p.price.amountMinor, p.price.currency)} · ${p.credits} credit${p.credits === 1 ? '' : 's'} · ${validityWords(p)} · ${PRODUCT_KIND_LABELS[p.kind]}` })),
        ]}
        error={e.productId?.message}
        {...register('productId', fieldChanged)}
      />
      <SelectField label="Paid with" options={methods} error={e.paymentMethodId?.message} {...register('paymentMethodId', fieldChanged)} />
      <Button type="submit" busy={formState.isSubmitting}>
        {formState.isSubmitting ? 'Selling…' : 'Sell'}
      </Button>
    </form>
  );
}
