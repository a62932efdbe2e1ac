import { useRef, useState } from 'react';
import type { LogSharpeningInput, RinkSummary, StationRow } from '@rinkwright/core';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { Card } from '../../../components/ui/layout';
import { useServices } from '../../../lib/queries/services';
import { lengthInput, parseLength, readingUnitLabel } from '../../../lib/units';
import { useCounterWrite, writes } from '../api/counter-writes';
import { HollowField } from './hollow-field';
import { buildLog, StationSelect, type LogDefaults } from './log-pair-form';
import type { ReadingDraft } from './reading-inputs';

/**
 * A team bag, pair after pair from the keyboard: type passes, the left and the right reading, press Enter, and
 * the next row is ready. Each row adds a pair to the ticket; nothing reloads between pairs.
 */
export function BatchLog({ rink, ticketId, stations, defaults, startAt }: { rink: RinkSummary; ticketId: string; stations: StationRow[]; defaults: LogDefaults; startAt: number }) {
  const unit = rink.unitPreference;
  const services = useServices(rink.slug);
  const active = (services.data?.services ?? []).filter((s) => s.active);
  const [stationId, setStationId] = useState(defaults.stationId);
  const [serviceId, setServiceId] = useState('');
  const [hollowNm, setHollowNm] = useState(defaults.hollowNm);
  const [bladeWidthNm, setWidth] = useState(defaults.bladeWidthNm);
  const [row, setRow] = useState({ passes: '', left: '', right: '' });
  const [count, setCount] = useState(0);
  const [problem, setProblem] = useState('');
  const first = useRef<HTMLInputElement>(null);
  const { run, busy } = useCounterWrite(rink.slug);
  const service = serviceId || active.find((s) => s.kind === 'standard')?.id || active[0]?.id || '';
  const label = `Pair ${startAt + count}`;

  async function submitRow() {
    setProblem('');
    const draft: ReadingDraft = { left: row.left, right: row.right };
    const built = buildLog({ stationId, hollowNm, bladeWidthNm, passes: row.passes, draft, mode: 'level' }, unit);
    if (!built.input) return setProblem(built.error ?? '');
    const input: LogSharpeningInput = { ...built.input, newPair: { label, serviceId: service, skateProfileId: null, bladeWidthNm, hollowNm, notes: null } };
    try {
      await run(writes.logSharpening(rink.slug, ticketId, input, `${label} (batch)`));
      setCount((n) => n + 1);
      setRow({ passes: '', left: '', right: '' });
      first.current?.focus();
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'Not saved');
    }
  }

  const enter = (e: React.KeyboardEvent<HTMLInputElement>) => {
    if (e.key !== 'Enter') return;
    e.preventDefault();
    const next = e.currentTarget.closest('form')?.querySelectorAll<HTMLInputElement>('input[data-row]');
    const list = next ? [...next] : [];
    const at = list.indexOf(e.currentTarget);
    if (at < list.length - 1) list[at + 1]?.focus();
    else if (!busy) void submitRow();
  };

  return (
    <Card title="Batch mode">
      <p className="mb-3 text-sm text-ink-soft">For a team bag: the settings below apply to every pair. Type passes, left, right, and press Enter after each; Enter on the last field logs the pair.</p>
      <div className="mb-4 grid gap-3 sm:grid-cols-4">
        <StationSelect stations={stations} value={stationId} onChange={setStationId} />
        <SelectField label="Service" value={service} onChange={(e) => setServiceId(e.target.value)} options={active.map((s) => ({ value: s.id, label: s.name }))} />
        <HollowField label="Hollow" valueNm={hollowNm} onChange={setHollowNm} unit={unit} />
        <TextField label={`Blade width (${unit})`} defaultValue={lengthInput(bladeWidthNm, unit, 'width')} onBlur={(e) => setWidth(parseLength(e.target.value, unit))} inputMode="decimal" />
      </div>
      <form onSubmit={(e) => e.preventDefault()} aria-label="Batch row" className="grid items-end gap-3 sm:grid-cols-[8rem_1fr_1fr_1fr]">
        <p className="pb-3 text-lg font-bold">{label}</p>
        <TextField ref={first} data-row label="Passes" value={row.passes} onChange={(e) => setRow({ ...row, passes: e.target.value })} onKeyDown={enter} inputMode="numeric" />
        <TextField data-row label={`Left (${readingUnitLabel(unit)})`} value={row.left} onChange={(e) => setRow({ ...row, left: e.target.value })} onKeyDown={enter} inputMode="decimal" />
        <TextField data-row label={`Right (${readingUnitLabel(unit)})`} value={row.right} onChange={(e) => setRow({ ...row, right: e.target.value })} onKeyDown={enter} inputMode="decimal" />
      </form>
      <div className="mt-3 flex items-center justify-between gap-3">
        <Alert>{problem}</Alert>
        <p className="text-sm font-semibold tabular-nums" aria-live="polite" data-testid="batch-count">
          {count} pair{count === 1 ? '' : 's'} logged in this batch
        </p>
      </div>
    </Card>
  );
}
