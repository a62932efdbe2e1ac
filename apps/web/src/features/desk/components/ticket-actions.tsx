import { useState } from 'react';
import type { RinkSummary, StationRow, TicketDetail, TransitionInput } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { useCounterWrite, writes } from '../api/counter-writes';

/** The moves a ticket can make from where it is; the server refuses any other, and says why. */
export function TicketActions({ rink, ticket, stations }: { rink: RinkSummary; ticket: TicketDetail; stations: StationRow[] }) {
  const { run, busy } = useCounterWrite(rink.slug);
  const [stationId, setStationId] = useState(ticket.stationId ?? stations.find((s) => s.status === 'active')?.id ?? '');
  const [reason, setReason] = useState('');
  const [voiding, setVoiding] = useState(false);
  const [problem, setProblem] = useState('');
  const move = async (input: TransitionInput, label: string) => {
    setProblem('');
    try {
      await run(writes.moveTicket(rink.slug, ticket.id, input, `Ticket ${ticket.number}: ${label}`));
      setVoiding(false);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'Not saved');
    }
  };
  const s = ticket.state;
  if (s === 'collected' || s === 'void') return null;
  return (
    <div className="space-y-3">
      <Alert>{problem}</Alert>
      <div className="flex flex-wrap items-end gap-2">
        {s === 'waiting' || s === 'ready' ? (
          <>
            <label className="text-sm font-semibold">
              Station
              <select className="mt-1 block min-h-11 rounded-lg border border-rule bg-white px-2" value={stationId} onChange={(e) => setStationId(e.target.value)}>
                {stations
                  .filter((st) => st.status === 'active')
                  .map((st) => (
                    <option key={st.id} value={st.id}>
                      {st.name}
                    </option>
                  ))}
              </select>
            </label>
            <Button busy={busy} disabled={!stationId} onClick={() => void move({ to: 'on_station', stationId }, 'on station')}>
              {s === 'ready' ? 'Back on a station' : 'Put on station'}
            </Button>
          </>
        ) : null}
        {s === 'on_station' ? (
          <>
            <Button busy={busy} onClick={() => void move({ to: 'ready' }, 'ready')}>
              Finish: ready for pick-up
            </Button>
            <Button tone="secondary" busy={busy} onClick={() => void move({ to: 'waiting' }, 'back to waiting')}>
              Back to waiting
            </Button>
          </>
        ) : null}
        {s === 'ready' ? (
          <Button busy={busy} onClick={() => void move({ to: 'collected' }, 'collected')}>
            Collected
          </Button>
        ) : null}
        <Button tone="danger" onClick={() => setVoiding(!voiding)}>
          Void…
        </Button>
      </div>
      {voiding ? (
        <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => (e.preventDefault(), void move({ to: 'void', reason }, 'void'))}>
          <label className="text-sm font-semibold">
            Why is it void?
            <input className="mt-1 block min-h-11 w-72 rounded-lg border border-rule px-3" value={reason} onChange={(e) => setReason(e.target.value)} />
          </label>
          <Button type="submit" tone="danger" busy={busy} disabled={reason.trim().length < 3}>
            Void the ticket
          </Button>
        </form>
      ) : null}
    </div>
  );
}
