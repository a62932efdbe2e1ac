import { Link } from 'react-router';
import type { StationRow, TicketState, TicketSummary } from '@rinkwright/core';
import { Alert, Loading } from '../../../components/ui/feedback';
import { formatDateTime } from '../../../lib/format';
import { useTickets } from '../api/get-tickets';

const COLUMNS: { state: TicketState; title: string }[] = [
  { state: 'waiting', title: 'Waiting' },
  { state: 'on_station', title: 'On station' },
  { state: 'ready', title: 'Ready' },
];

function time(iso: string, timeZone: string) {
  return new Intl.DateTimeFormat(undefined, { timeStyle: 'short', timeZone }).format(new Date(iso));
}

function TicketCard({ t, slug, timeZone, stations }: { t: TicketSummary; slug: string; timeZone: string; stations: StationRow[] }) {
  const late = t.state !== 'ready' && new Date(t.promisedAt).getTime() < Date.now();
  const station = stations.find((s) => s.id === t.stationId);
  return (
    <li>
      <Link to={`/rinks/${slug}/tickets/${t.id}`} className="block rounded-lg border border-rule bg-white p-3 shadow-sm hover:border-steel" aria-label={`Ticket ${t.number}, ${t.customer.name}`}>
        <div className="flex items-baseline justify-between gap-2">
          <span className="text-lg font-extrabold tabular-nums">#{t.number}</span>
          <span className={`text-sm font-semibold tabular-nums ${late ? 'text-brick' : 'text-ink-soft'}`} title={formatDateTime(t.promisedAt, timeZone)}>
            {t.state === 'ready' ? `ready ${t.readyAt ? time(t.readyAt, timeZone) : ''}` : `${late ? 'late · ' : ''}promised ${time(t.promisedAt, timeZone)}`}
          </span>
        </div>
        <p className="font-semibold">{t.customer.name}</p>
        <p className="text-sm text-ink-soft tabular-nums">
          {t.pairsDone} of {t.pairCount} pair{t.pairCount === 1 ? '' : 's'} done{station ? ` · ${station.name}` : ''}
        </p>
      </Link>
    </li>
  );
}

/** The whole counter's queue, refreshed every few seconds so several tablets see each other's moves. */
export function QueueBoard({ slug, timeZone, stations, stationId }: { slug: string; timeZone: string; stations: StationRow[]; stationId: string }) {
  const tickets = useTickets(slug, { state: 'open', ...(stationId ? { stationId } : {}) });
  if (tickets.isPending) return <Loading label="Loading the queue…" />;
  if (tickets.isError) return <Alert>{tickets.error.message}</Alert>;
  return (
    <div className="grid gap-4 md:grid-cols-3">
      {COLUMNS.map((col) => {
        const list = tickets.data.tickets.filter((t) => t.state === col.state);
        return (
          <section key={col.state} aria-label={col.title} className="rounded-xl bg-glacier/60 p-3">
            <h3 className="mb-2 flex items-center justify-between font-bold">
              {col.title} <span className="rounded-full bg-white px-2 text-sm tabular-nums">{list.length}</span>
            </h3>
            <ul className="space-y-2">
              {list.map((t) => (
                <TicketCard key={t.id} t={t} slug={slug} timeZone={timeZone} stations={stations} />
              ))}
            </ul>
            {list.length === 0 ? <p className="py-4 text-center text-sm text-ink-soft">None</p> : null}
          </section>
        );
      })}
    </div>
  );
}
