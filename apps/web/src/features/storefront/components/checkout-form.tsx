import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useState } from 'react';
import { useForm } from 'react-hook-form';
import { checkoutInput, type CheckoutInput, type PublicProduct } from '@rinkwright/core';
import type { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { applyServerErrors } from '../../../lib/forms';
import { useMe } from '../../../lib/session';
import { useStartCheckout } from '../api/start-checkout';
import { formatMoney } from '../../../lib/format';
import { productTerms } from './product-terms';

type Values = z.input<typeof checkoutInput>;

/** Name and e-mail for the credits, then off to the payment service's own checkout page. */
export function CheckoutForm({ slug, product, onCancel }: { slug: string; product: PublicProduct; onCancel: () => void }) {
  const { data: me } = useMe();
  const start = useStartCheckout(slug);
  const [problem, setProblem] = useState('');
  const [leaving, setLeaving] = useState(false);
  useEffect(() => {
    // Coming back with the browser's Back button restores this page as it was left, busy button included.
    const restored = (event: PageTransitionEvent) => event.persisted && setLeaving(false);
    window.addEventListener('pageshow', restored);
    return () => window.removeEventListener('pageshow', restored);
  }, []);
  const { register, handleSubmit, formState, setError } = useForm<Values, unknown, CheckoutInput>({
    resolver: zodResolver(checkoutInput),
    defaultValues: { productId: product.id, name: me?.user.name ?? '', email: me?.user.email ?? '' },
  });
  const e = formState.errors;

  const onSubmit = handleSubmit(async (input) => {
    setProblem('');
    try {
      const { url } = await start.mutateAsync(input);
      setLeaving(true);
      window.location.assign(url);
    } catch (error) {
      setProblem(applyServerErrors(error, setError, ['name', 'email']));
    }
  });

  // While the browser leaves for the payment page the button stays busy, so a second press cannot start a second checkout.
  const busy = formState.isSubmitting || leaving;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={`Buy ${product.name}`}>
      <div>
        <p className="font-bold">{product.name}</p>
        <p className="text-sm text-ink-soft tabular-nums">
          {productTerms(product)} · {formatMoney(product.price.amountMinor, product.price.currency)}
        </p>
      </div>
      <Alert>{problem}</Alert>
      {me ? (
        <Alert tone="info">
          You are signed in as {me.user.email}: the credits go to your account at this rink, and you can see them under My skates.
        </Alert>
      ) : null}
      <TextField label="Name" autoComplete="name" autoFocus error={e.name?.message} {...register('name')} />
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        readOnly={Boolean(me)}
        hint={me ? 'Your account’s address.' : 'The credits belong to this address; the receipt goes here too.'}
        error={e.email?.message}
        {...register('email')}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy}>
          {busy ? 'Opening checkout…' : 'Continue to payment'}
        </Button>
        <Button tone="secondary" onClick={onCancel} disabled={busy}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
