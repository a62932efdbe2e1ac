import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { refundInput, type PaymentRow } from '@rinkwright/core';
import type { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Alert, Loading } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { formatMoney } from '../../../lib/format';
import { applyServerErrors } from '../../../lib/forms';
import { useRefundQuote } from '../api/get-refund-quote';
import { usePressKey } from '../api/press-key';
import { useRefundPayment } from '../api/refund-payment';

/** Shows what a refund returns and removes, by the rule in words, and refunds only once a reason is given. */
export function RefundDialog({ slug, customerId, payment, onClose }: { slug: string; customerId: string; payment: PaymentRow; onClose: (done: string | null) => void }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const quote = useRefundQuote(slug, payment.id);
  const refund = useRefundPayment(slug, customerId);
  const press = usePressKey();
  const [problem, setProblem] = useState('');
  const { register, handleSubmit, formState, setError } = useForm<z.input<typeof refundInput>, unknown, z.output<typeof refundInput>>({
    resolver: zodResolver(refundInput),
    defaultValues: { reason: '' },
  });

  useEffect(() => {
    dialog.current?.showModal();
  }, []);

  const onSubmit = handleSubmit(async ({ reason }) => {
    setProblem('');
    const key = press.take();
    try {
      const refunded = await refund.mutateAsync({ paymentId: payment.id, reason, key });
      press.done();
      const last = refunded.refunds.at(-1);
      onClose(`Refunded ${formatMoney(last?.amountMinor ?? refunded.refundedMinor, refunded.currency)}${last ? `, ${last.credits} credit${last.credits === 1 ? '' : 's'} removed` : ''}.`);
    } catch (error) {
      const lost = error instanceof ApiError && (error.code === 'network' || error.status >= 500);
      if (!lost) press.done();
      const text = applyServerErrors(error, setError, ['reason']);
      setProblem(lost ? `${text} Press Refund again to retry this same refund; it cannot be paid twice.` : text);
    }
  });

  return (
    <dialog
      ref={dialog}
      aria-labelledby={`refund-${payment.id}`}
      className="m-auto w-full max-w-lg rounded-xl border border-rule bg-white p-6 text-ink shadow-lg backdrop:bg-ink/40"
      onCancel={() => onClose(null)}
    >
      <h2 id={`refund-${payment.id}`} className="mb-3 text-lg font-bold">
        Refund {payment.productName}
      </h2>
      {quote.isPending ? (
        <Loading label="Working out the refund…" />
      ) : quote.isError ? (
        <Alert>{quote.error.message}</Alert>
      ) : quote.data.credits === 0 ? (
        <p className="mb-4 rounded-lg bg-glacier px-4 py-3 text-sm">Nothing is left to refund on this payment: its credits have been used or refunded already.</p>
      ) : (
        <div className="mb-4 space-y-3">
          <p className="text-sm">{quote.data.rule}</p>
          <dl className="grid grid-cols-2 gap-3">
            <div className="rounded-lg bg-glacier px-4 py-3">
              <dt className="text-sm text-ink-soft">Credits removed</dt>
              <dd className="text-2xl font-bold tabular-nums">{quote.data.credits}</dd>
            </div>
            <div className="rounded-lg bg-glacier px-4 py-3">
              <dt className="text-sm text-ink-soft">Refund</dt>
              <dd className="text-2xl font-bold tabular-nums">{formatMoney(quote.data.refundMinor, quote.data.currency)}</dd>
            </div>
          </dl>
          <p className="rounded-lg border-l-4 border-brick bg-red-50 px-4 py-3 text-sm text-ink">
            {payment.channel === 'online'
              ? 'The money goes back to the card the skater paid with. '
              : 'A card payment goes back to its card; for a cash sale, hand the money back from the till: Rinkwright only records it. '}
            A refund cannot be undone.
          </p>
        </div>
      )}
      {quote.isSuccess && quote.data.credits === 0 ? (
        <Button tone="secondary" onClick={() => onClose(null)}>
          Close
        </Button>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label={`Refund ${payment.productName}`}>
          <Alert>{problem}</Alert>
          <TextField label="Reason" autoComplete="off" autoFocus hint="Kept in the ledger beside the refund." error={formState.errors.reason?.message} {...register('reason')} />
          <div className="flex flex-wrap gap-2">
            <Button type="submit" tone="danger" busy={formState.isSubmitting} disabled={formState.isSubmitting || !quote.isSuccess}>
              {formState.isSubmitting ? 'Refunding…' : quote.isSuccess ? `Refund ${formatMoney(quote.data.refundMinor, quote.data.currency)}` : 'Refund'}
            </Button>
            <Button tone="secondary" onClick={() => onClose(null)}>
              Keep the payment
            </Button>
          </div>
        </form>
      )}
    </dialog>
  );
}
