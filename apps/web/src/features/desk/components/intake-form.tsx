import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useNavigate } from 'react-router';
import { createTicketInput, type CustomerRow, type PairInput, type RinkSummary } from '@rinkwright/core';
import { Button, LinkButton } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { useServices } from '../../../lib/queries/services';
import { lengthInput, parseLength, showLength } from '../../../lib/units';
import { useCreditBalance } from '../api/get-credit-balance';
import { useCounterTeams } from '../api/get-counter-teams';
import { useCustomer } from '../api/get-customer';
import { usePromise } from '../api/get-promise';
import { useCounterWrite, writes } from '../api/counter-writes';
import { HollowField } from './hollow-field';

type Row = PairInput & { key: number };
type Payment = 'credit' | 'allocation' | 'counter' | 'no_charge';

/** Take skates in: a pair per row (from the skater's profiles or typed), the service, how it is paid, the promise. */
export function IntakeForm({ rink, customer, onDone }: { rink: RinkSummary; customer: CustomerRow; onDone: () => void }) {
  const navigate = useNavigate();
  const services = useServices(rink.slug);
  const detail = useCustomer(rink.slug, customer.id);
  const active = (services.data?.services ?? []).filter((s) => s.active);
  const standard = active.find((s) => s.kind === 'standard') ?? active[0];
  const [picked, setRows] = useState<Row[]>([]);
  // A pair added before the services arrived has no service yet: it takes the standard one once they do.
  const rows = picked.map((r) => (r.serviceId || !standard ? r : { ...r, serviceId: standard.id }));
  const [payment, setPayment] = useState<Payment>('counter');
  const [teamId, setTeamId] = useState('');
  const client = useQueryClient();
  const balance = useCreditBalance(rink.slug, customer.id, rink.permissions.credit?.includes('read') ?? false);
  const teams = useCounterTeams(rink.slug, payment === 'allocation');
  const [note, setNote] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const promise = usePromise(rink.slug, Math.max(1, rows.length));
  const { run, busy } = useCounterWrite(rink.slug);
  const unit = rink.unitPreference;

  const blank = (over: Partial<Row> = {}): Row => ({
    key: Date.now() + Math.random(),
    skateProfileId: null,
    label: `Pair ${rows.length + 1}`,
    bladeWidthNm: null,
    hollowNm: null,
    serviceId: '',
    notes: null,
    ...over,
  });
  const update = (key: number, change: Partial<Row>) => setRows((list) => list.map((r) => (r.key === key ? { ...r, ...change } : r)));

  async function submit() {
    setNote(null);
    const input = { customerId: customer.id, payment, teamId: payment === 'allocation' ? teamId || null : null, notes: null, pairs: rows.map(({ key: _k, ...p }) => p) };
    const parsed = createTicketInput.safeParse(input);
    if (!parsed.success) {
      const fields: Record<string, string[]> = {};
      for (const i of parsed.error.issues) (fields[i.path.join('.')] ??= []).push(i.message);
      setErrors(fields);
      return;
    }
    setErrors({});
    try {
      const outcome = await run(writes.createTicket(rink.slug, parsed.data, `New ticket for ${customer.name} (${rows.length} pair${rows.length === 1 ? '' : 's'})`));
      if (outcome.queued) {
        setNote({ tone: 'success', text: 'Saved on this tablet: the ticket gets its number as soon as the connection is back.' });
        setRows([]);
        return;
      }
      void client.invalidateQueries({ queryKey: ['rink', rink.slug, 'credits'] });
      void client.invalidateQueries({ queryKey: ['rink', rink.slug, 'leagues'] });
      onDone();
      navigate(`/rinks/${rink.slug}/tickets/${outcome.result.id}`);
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      // Not enough credits is about how the pairs are paid: shown by that choice, not only at the top.
      else if (error instanceof ApiError && error.code === 'insufficient_credits') setErrors({ payment: [error.message] });
      setNote({ tone: 'error', text: error instanceof Error ? error.message : 'The ticket was not saved' });
    }
  }

  if (services.isSuccess && active.length === 0) {
    return (
      <Alert tone="info">
        The rink has no services yet.{' '}
        {rink.permissions.service?.includes('manage') ? <LinkButton to={`/rinks/${rink.slug}/services`} tone="quiet">Add one</LinkButton> : 'Ask a manager to add one.'}
      </Alert>
    );
  }

  return (
    <div className="space-y-4">
      {note ? <Alert tone={note.tone}>{note.text}</Alert> : null}
      <div className="flex flex-wrap gap-2">
        {(detail.data?.profiles ?? []).map((p) => (
          <Button
            key={p.id}
            tone="secondary"
            onClick={() => setRows((list) => [...list, blank({ skateProfileId: p.id, label: p.label, bladeWidthNm: p.bladeWidthNm, hollowNm: p.preferredHollowNm })])}
          >
            + {p.label} {p.preferredHollowNm ? `(${showLength(p.preferredHollowNm, unit, 'hollow')})` : ''}
          </Button>
        ))}
        <Button tone="secondary" onClick={() => setRows((list) => [...list, blank()])}>
          + Another pair
        </Button>
      </div>
      {errors.pairs ? <Alert>{errors.pairs.join(' ')}</Alert> : null}
      <ol className="space-y-3">
        {rows.map((r, i) => (
          <li key={r.key} className="grid gap-3 rounded-lg border border-rule bg-white p-3 sm:grid-cols-[1fr_1fr_auto_8rem_auto] sm:items-end">
            <TextField label={`Pair ${i + 1}`} value={r.label} onChange={(e) => update(r.key, { label: e.target.value })} error={errors[`pairs.${i}.label`]?.join(' ')} />
            <SelectField
              label="Service"
              value={r.serviceId}
              onChange={(e) => update(r.key, { serviceId: e.target.value })}
              options={active.map((s) => ({ value: s.id, label: `${s.name} · ${new Intl.NumberFormat(undefined, { style: 'currency', currency: rink.currency }).format(s.priceMinor / 100)}` }))}
              error={errors[`pairs.${i}.serviceId`]?.join(' ')}
            />
            <HollowField label="Hollow" valueNm={r.hollowNm} onChange={(nm) => update(r.key, { hollowNm: nm })} unit={unit} />
            <TextField
              label={`Blade width (${unit})`}
              defaultValue={lengthInput(r.bladeWidthNm, unit, 'width')}
              onBlur={(e) => update(r.key, { bladeWidthNm: parseLength(e.target.value, unit) })}
              inputMode="decimal"
            />
            <Button tone="quiet" aria-label={`Remove pair ${i + 1}`} onClick={() => setRows((list) => list.filter((x) => x.key !== r.key))}>
              Remove
            </Button>
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <PaymentChoice
          rink={rink}
          payment={payment}
          onPayment={setPayment}
          teamId={teamId}
          onTeam={setTeamId}
          credits={balance.data?.credits}
          teams={teams.data?.teams}
          creditPairs={rows.filter((r) => active.find((sv) => sv.id === r.serviceId)?.kind === 'standard').length}
          errors={errors}
        />
        <p className="text-sm" aria-live="polite">
          {promise.data ? (
            <>
              Promise: <strong className="text-lg tabular-nums">{formatDateTime(promise.data.promisedAt, rink.timeZone)}</strong>
              <span className="block text-ink-soft">about {Math.round(promise.data.minutesPerPair)} min a pair, {promise.data.stationsActive} station(s) active</span>
            </>
          ) : promise.isError ? (
            <span className="text-brick">{promise.error.message}</span>
          ) : null}
        </p>
        <Button busy={busy} disabled={rows.length === 0} onClick={() => void submit()}>
          {busy ? 'Saving…' : `Take in ${rows.length || ''} pair${rows.length === 1 ? '' : 's'}`}
        </Button>
      </div>
    </div>
  );
}

/** How the ticket is paid; a credit or an allocation pays one credit per standard-sharpening pair. */
function PaymentChoice({
  rink,
  payment,
  onPayment,
  teamId,
  onTeam,
  credits,
  teams,
  creditPairs,
  errors,
}: {
  rink: RinkSummary;
  payment: Payment;
  onPayment: (p: Payment) => void;
  teamId: string;
  onTeam: (id: string) => void;
  credits: number | undefined;
  teams: { id: string; name: string; leagueName: string; credits: number }[] | undefined;
  creditPairs: number;
  errors: Record<string, string[]>;
}) {
  const drawn = payment === 'credit' || payment === 'allocation';
  return (
    <div className="min-w-64 space-y-2">
      <SelectField
        label="Paid"
        value={payment}
        onChange={(e) => onPayment(e.target.value as Payment)}
        error={errors.payment?.join(' ')}
        hint={drawn ? `One credit per standard-sharpening pair: ${creditPairs} credit${creditPairs === 1 ? '' : 's'} for this ticket.` : undefined}
        options={[
          { value: 'counter', label: 'At the counter' },
          ...(rink.permissions.credit?.includes('read') ? [{ value: 'credit', label: `From the skater's credits (${credits ?? '…'} left)` }] : []),
          { value: 'allocation', label: "From a team's allocation" },
          { value: 'no_charge', label: 'No charge' },
        ]}
      />
      {payment === 'allocation' ? (
        <SelectField
          label="Team"
          value={teamId}
          onChange={(e) => onTeam(e.target.value)}
          error={errors.teamId?.join(' ')}
          options={[
            { value: '', label: teams ? (teams.length ? 'Choose the team' : 'No team has an allocation') : 'Loading teams…' },
            ...(teams ?? []).map((t) => ({ value: t.id, label: `${t.name} · ${t.leagueName} · ${t.credits} credit${t.credits === 1 ? '' : 's'} left` })),
          ]}
        />
      ) : null}
    </div>
  );
}
