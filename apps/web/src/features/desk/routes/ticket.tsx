import { Link, useParams } from 'react-router';
import { STATE_WORDS } from '../components/state-words';
import { Alert, Loading } from '../../../components/ui/feedback';
import { Card, PageHeader } from '../../../components/ui/layout';
import { NotFound } from '../../../components/ui/not-found';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { bandsOfStation, useDeskSettings, useStations } from '../../../lib/queries/stations';
import { can, useRink } from '../../../lib/rink-context';
import { useTicket } from '../api/get-ticket';
import { BatchLog } from '../components/batch-log';
import { LogPairForm } from '../components/log-pair-form';
import { SharpeningCard } from '../components/sharpening-card';
import { TicketActions } from '../components/ticket-actions';


export function Component() {
  const rink = useRink();
  const { ticketId = '' } = useParams();
  const ticket = useTicket(rink.slug, ticketId);
  const stations = useStations(rink.slug);
  const settings = useDeskSettings(rink.slug);
  if (ticket.isPending) return <Loading />;
  if (ticket.isError) return ticket.error instanceof ApiError && ticket.error.status === 404 ? <NotFound message="No such ticket at this rink." /> : <Alert>{ticket.error.message}</Alert>;
  const t = ticket.data;
  const list = stations.data?.stations ?? [];
  const station = list.find((s) => s.id === t.stationId) ?? list.find((s) => s.status === 'active');
  const canWork = can(rink, 'ticket', 'work') && (t.state === 'waiting' || t.state === 'on_station');
  const defaults = { stationId: station?.id ?? '', hollowNm: station?.wheel?.hollowNm ?? null, bladeWidthNm: null };

  return (
    <div className="space-y-6">
      <PageHeader
        title={`Ticket ${t.number}`}
        subtitle={
          <>
            <Link className="font-semibold text-steel underline" to={`/rinks/${rink.slug}/customers/${t.customer.id}`}>
              {t.customer.name}
            </Link>{' '}
            · <strong>{STATE_WORDS[t.state]}</strong> · dropped off {formatDateTime(t.droppedAt, rink.timeZone)} · promised{' '}
            <span className="tabular-nums">{formatDateTime(t.promisedAt, rink.timeZone)}</span>
          </>
        }
      />
      {t.voidReason ? <Alert>Void: {t.voidReason}</Alert> : null}
      {can(rink, 'ticket', 'work') ? <TicketActions rink={rink} ticket={t} stations={list} /> : null}
      <div className="space-y-4">
        {t.pairs.map((p) => {
          const originals = p.sharpenings.filter((s) => !s.correctsId);
          return (
            <Card key={p.id} title={`${p.label} · ${p.serviceName}`}>
              {p.notes ? <p className="mb-2 text-sm">{p.notes}</p> : null}
              <div className="space-y-3">
                {originals.map((s) => (
                  <SharpeningCard
                    key={s.id}
                    rink={rink}
                    sharpening={s}
                    corrections={p.sharpenings.filter((c) => c.correctsId === s.id)}
                    bands={bandsOfStation(settings.data, list.find((st) => st.id === s.stationId))}
                    canWork={can(rink, 'ticket', 'work')}
                  />
                ))}
                {originals.length === 0 && canWork ? <LogPairForm rink={rink} ticketId={t.id} pair={p} stations={list} defaults={defaults} /> : null}
                {originals.length === 0 && !canWork ? <p className="text-sm text-ink-soft">Not sharpened yet.</p> : null}
              </div>
            </Card>
          );
        })}
      </div>
      {canWork ? <BatchLog rink={rink} ticketId={t.id} stations={list} defaults={defaults} startAt={t.pairs.length + 1} /> : null}
      <Card title="History">
        <ol className="space-y-1 text-sm">
          {t.events.map((e, i) => (
            <li key={i} className="tabular-nums">
              {formatDateTime(e.at, rink.timeZone)} · {e.by}: {e.fromState ? `${STATE_WORDS[e.fromState]} → ` : 'taken in, '}
              {STATE_WORDS[e.toState]}
              {e.stationName ? ` (${e.stationName})` : ''}
              {e.reason ? ` — “${e.reason}”` : ''}
            </li>
          ))}
        </ol>
      </Card>
    </div>
  );
}
