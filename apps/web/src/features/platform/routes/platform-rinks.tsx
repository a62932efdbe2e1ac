import type { ColumnDef } from '@tanstack/react-table';
import { useMemo, useRef, useState } from 'react';
import type { PlatformRinkRow } from '@rinkwright/core';
import { Button, LinkButton } from '../../../components/ui/button';
import { DataTable } from '../../../components/ui/data-table';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { formatCount, formatDate, formatMoney } from '../../../lib/format';
import { useMe } from '../../../lib/session';
import { usePlatformRinks } from '../api/get-platform-rinks';
import { useReactivateRink } from '../api/reactivate-rink';
import { Badge, PlanState, planWords } from '../components/plan-state';
import { SuspendDialog } from '../components/suspend-dialog';

type Note = { tone: 'success' | 'error'; text: string };

/** A number column's header: its word, and under it what the number counts. */
const heading = (word: string, counts: string) => (
  <span className="block text-right leading-tight">
    {word}
    <span className="block whitespace-nowrap text-xs font-medium">{counts}</span>
  </span>
);
const number = (text: string) => <span className="block text-right tabular-nums">{text}</span>;

/** Fees are each rink's own currency (the fee is taken on its sales): added up per currency, never across. */
function feesByCurrency(rinks: PlatformRinkRow[]): { currency: string; minor: number }[] {
  const sums = new Map<string, number>();
  for (const r of rinks) sums.set(r.currency, (sums.get(r.currency) ?? 0) + r.volume.feesMinor30d);
  return [...sums].map(([currency, minor]) => ({ currency, minor })).sort((a, b) => a.currency.localeCompare(b.currency));
}

function Totals({ rinks }: { rinks: PlatformRinkRow[] }) {
  const suspended = rinks.filter((r) => r.suspension).length;
  const active = rinks.reduce((n, r) => n + r.plan.activeStations, 0);
  const billed = rinks.reduce((n, r) => n + r.plan.stations, 0);
  const pairs = rinks.reduce((n, r) => n + r.volume.pairs30d, 0);
  const fees = feesByCurrency(rinks);
  const cards = [
    { label: 'Rinks', value: [formatCount(rinks.length)], note: suspended === 0 ? 'None suspended' : `${formatCount(suspended)} suspended` },
    { label: 'Active stations', value: [formatCount(active)], note: `${formatCount(billed)} billed on plans` },
    { label: 'Pairs, last 30 days', value: [formatCount(pairs)], note: 'Sharpened at every rink' },
    {
      label: 'Platform fees, last 30 days',
      value: fees.length === 0 ? ['None'] : fees.map((f) => formatMoney(f.minor, f.currency)),
      note: fees.length > 1 ? 'Each currency on its own line' : `In ${fees[0]?.currency ?? 'the rinks’ currencies'}`,
    },
  ];
  return (
    <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" aria-label="Platform totals">
      {cards.map((c) => (
        <div key={c.label} className="rounded-lg bg-glacier px-4 py-3">
          <dt className="text-sm font-medium text-ink-soft">{c.label}</dt>
          {c.value.map((v) => (
            <dd key={v} className="mt-1 text-2xl font-bold tabular-nums">
              {v}
            </dd>
          ))}
          <dd className="mt-1 text-xs text-ink-soft">{c.note}</dd>
        </div>
      ))}
    </dl>
  );
}

function Access({ rink }: { rink: PlatformRinkRow }) {
  if (!rink.suspension) return <Badge tone="good">Open</Badge>;
  return (
    <span className="inline-flex min-w-36 max-w-56 flex-col items-start gap-1">
      <Badge tone="stopped">Suspended</Badge>
      <span className="text-xs text-ink-soft">
        Since {formatDate(rink.suspension.at)}: {rink.suspension.reason}
      </span>
    </span>
  );
}

export function Component() {
  const me = useMe();
  const rinks = usePlatformRinks();
  const reactivate = useReactivateRink();
  const [suspending, setSuspending] = useState<PlatformRinkRow | null>(null);
  const [note, setNote] = useState<Note | null>(null);
  const noteRef = useRef<HTMLDivElement>(null);
  const opener = useRef<HTMLElement | null>(null);

  const columns = useMemo<ColumnDef<PlatformRinkRow, unknown>[]>(() => {
    const tell = (next: Note) => {
      setNote(next);
      // The row's button changes under the pointer; the note says what happened, so the focus goes there.
      requestAnimationFrame(() => noteRef.current?.focus());
    };
    const onReactivate = (rink: PlatformRinkRow) => {
      setNote(null);
      reactivate.mutate(rink.id, {
        onSuccess: () => tell({ tone: 'success', text: `${rink.name} is reactivated: its staff can work again and its public page is open.` }),
        onError: (error) => tell({ tone: 'error', text: error instanceof ApiError ? error.message : 'The rink could not be reactivated. Try again.' }),
      });
    };
    return [
      {
        accessorKey: 'name',
        header: 'Rink',
        cell: ({ row }) => (
          <span className="flex min-w-40 flex-col">
            <span className="font-semibold">{row.original.name}</span>
            <span className="text-xs text-ink-soft">/r/{row.original.slug}</span>
            <span className="text-xs text-ink-soft tabular-nums">
              {formatCount(row.original.members)} staff · {formatCount(row.original.customers)} customers
            </span>
          </span>
        ),
      },
      {
        id: 'plan',
        header: 'Plan',
        accessorFn: (r) => planWords(r.plan, r.timeZone).label,
        cell: ({ row }) => (
          <span className="block min-w-32">
            <PlanState plan={row.original.plan} timeZone={row.original.timeZone} />
          </span>
        ),
      },
      {
        id: 'stations',
        header: () => heading('Stations', 'active / billed'),
        accessorFn: (r) => r.plan.activeStations,
        cell: ({ row }) => number(`${formatCount(row.original.plan.activeStations)} / ${formatCount(row.original.plan.stations)}`),
      },
      { id: 'pairs', header: () => heading('Pairs', 'last 30 days'), accessorFn: (r) => r.volume.pairs30d, cell: ({ row }) => number(formatCount(row.original.volume.pairs30d)) },
      {
        id: 'fees',
        header: () => heading('Fees', 'last 30 days'),
        accessorFn: (r) => r.volume.feesMinor30d,
        cell: ({ row }) => number(formatMoney(row.original.volume.feesMinor30d, row.original.currency)),
      },
      { id: 'access', header: 'Access', accessorFn: (r) => (r.suspension ? 1 : 0), cell: ({ row }) => <Access rink={row.original} /> },
      {
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        cell: ({ row }) => {
          const rink = row.original;
          const busy = reactivate.isPending && reactivate.variables === rink.id;
          return (
            <span className="flex justify-end gap-2 whitespace-nowrap">
              <LinkButton tone="secondary" to={`/platform/rinks/${encodeURIComponent(rink.id)}/reports`} aria-label={`Reports of ${rink.name}`}>
                Reports
              </LinkButton>
              {rink.suspension ? (
                <Button tone="primary" busy={busy} aria-label={`Reactivate ${rink.name}`} onClick={() => onReactivate(rink)}>
                  {busy ? 'Reactivating…' : 'Reactivate'}
                </Button>
              ) : (
                <Button
                  tone="danger"
                  aria-label={`Suspend ${rink.name}…`}
                  onClick={(e) => {
                    setNote(null);
                    opener.current = e.currentTarget;
                    setSuspending(rink);
                  }}
                >
                  Suspend…
                </Button>
              )}
            </span>
          );
        },
      },
    ];
  }, [reactivate]);

  if (me.data && !me.data.user.platformAdmin) return <NotFound />;
  return (
    <div className="mx-auto max-w-6xl space-y-6 px-4 py-8">
      <PageHeader title="Platform console" subtitle="Every rink on Rinkwright: its plan, its last 30 days and its access." />
      {note ? (
        <div ref={noteRef} tabIndex={-1} className="outline-none">
          <Alert tone={note.tone}>{note.text}</Alert>
        </div>
      ) : null}
      {rinks.isPending ? (
        <Loading label="Reading the rinks…" />
      ) : rinks.isError ? (
        <Alert>{rinks.error.message}</Alert>
      ) : (
        <>
          <Totals rinks={rinks.data.rinks} />
          <Card title="Rinks">
            <DataTable data={rinks.data.rinks} columns={columns} caption="Rinks on the platform" empty="No rinks yet." />
            <p className="mt-3 text-sm text-ink-soft">
              Pairs and fees are the last 30 days from the rinks’ report summaries; fees are in each rink’s own currency. Billed stations are the plan’s paid quantity.
            </p>
          </Card>
        </>
      )}
      {suspending ? (
        <SuspendDialog
          rink={suspending}
          onClose={(done) => {
            setSuspending(null);
            if (done) {
              setNote({ tone: 'success', text: done });
              requestAnimationFrame(() => noteRef.current?.focus());
            } else {
              opener.current?.focus();
            }
          }}
        />
      ) : null}
    </div>
  );
}
