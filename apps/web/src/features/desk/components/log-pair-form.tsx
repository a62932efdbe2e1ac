import { useState } from 'react';
import type { LogSharpeningInput, RinkSummary, StationRow, TicketPairRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { SelectField, TextField } from '../../../components/ui/field';
import { lengthInput, parseLength } from '../../../lib/units';
import { useCounterWrite, writes } from '../api/counter-writes';
import { HollowField } from './hollow-field';
import { ReadingInputs, readingsOf, type ReadingDraft, type ReadingMode } from './reading-inputs';

export interface LogDefaults {
  stationId: string;
  hollowNm: number | null;
  bladeWidthNm: number | null;
}

/** The fields every log of a pair needs, checked before the write is queued. */
export function buildLog(d: { stationId: string; hollowNm: number | null; bladeWidthNm: number | null; passes: string; draft: ReadingDraft; mode: ReadingMode }, unit: RinkSummary['unitPreference']) {
  const passes = Number(d.passes);
  if (!d.stationId) return { error: 'Choose the station' };
  if (!d.hollowNm) return { error: 'Give the hollow used' };
  if (!d.bladeWidthNm) return { error: 'Give the blade width' };
  if (!Number.isInteger(passes) || passes < 1) return { error: 'Passes must be a whole number, at least 1' };
  const { readings, error } = readingsOf(d.draft, d.mode, unit);
  if (error) return { error };
  return { input: { stationId: d.stationId, hollowNm: d.hollowNm, bladeWidthNm: d.bladeWidthNm, passes, readings } };
}

export function StationSelect({ stations, value, onChange }: { stations: StationRow[]; value: string; onChange: (id: string) => void }) {
  return (
    <SelectField
      label="Station"
      value={value}
      onChange={(e) => onChange(e.target.value)}
      options={[{ value: '', label: 'Choose…' }, ...stations.filter((s) => s.status === 'active').map((s) => ({ value: s.id, label: s.name }))]}
    />
  );
}

/** Log one pair of the ticket: hollow used, passes, blade width and a level reading per blade. */
export function LogPairForm({ rink, ticketId, pair, stations, defaults }: { rink: RinkSummary; ticketId: string; pair: TicketPairRow; stations: StationRow[]; defaults: LogDefaults }) {
  const unit = rink.unitPreference;
  const [stationId, setStationId] = useState(defaults.stationId);
  const [hollowNm, setHollowNm] = useState(pair.hollowNm ?? defaults.hollowNm);
  const [bladeWidthNm, setWidth] = useState(pair.bladeWidthNm ?? defaults.bladeWidthNm);
  const [passes, setPasses] = useState('');
  const [mode, setMode] = useState<ReadingMode>('level');
  const [draft, setDraft] = useState<ReadingDraft>({ left: '', right: '' });
  const [problem, setProblem] = useState('');
  const [queued, setQueued] = useState(false);
  const { run, busy } = useCounterWrite(rink.slug);

  async function submit() {
    setProblem('');
    const built = buildLog({ stationId, hollowNm, bladeWidthNm, passes, draft, mode }, unit);
    if (!built.input) return setProblem(built.error ?? '');
    try {
      const input: LogSharpeningInput = { ...built.input, pairId: pair.id };
      const outcome = await run(writes.logSharpening(rink.slug, ticketId, input, `${pair.label} logged`));
      setQueued(outcome.queued);
    } catch (error) {
      setProblem(error instanceof Error ? error.message : 'Not saved');
    }
  }

  if (queued) return <Alert tone="info">Logged on this tablet; it is sent when the connection is back.</Alert>;
  return (
    <form
      className="grid gap-3 rounded-lg border border-dashed border-steel/50 p-3 sm:grid-cols-3"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
      aria-label={`Log ${pair.label}`}
    >
      <div className="sm:col-span-3">
        <Alert>{problem}</Alert>
      </div>
      <StationSelect stations={stations} value={stationId} onChange={setStationId} />
      <HollowField label="Hollow used" valueNm={hollowNm} onChange={setHollowNm} unit={unit} />
      <TextField label={`Blade width (${unit})`} defaultValue={lengthInput(bladeWidthNm, unit, 'width')} onBlur={(e) => setWidth(parseLength(e.target.value, unit))} inputMode="decimal" />
      <TextField label="Passes" value={passes} onChange={(e) => setPasses(e.target.value)} inputMode="numeric" />
      <ReadingInputs draft={draft} onChange={setDraft} mode={mode} unit={unit} idPrefix={`log-${pair.id}`} />
      <label className="flex min-h-11 items-center gap-2 text-sm">
        <input type="checkbox" className="h-5 w-5" checked={mode === 'tilt'} onChange={(e) => setMode(e.target.checked ? 'tilt' : 'level')} />
        Enter readings as the tilt angle of a bar on both edges
      </label>
      <div className="sm:col-span-2 sm:text-right">
        <Button type="submit" busy={busy}>
          {busy ? 'Saving…' : `Log ${pair.label}`}
        </Button>
      </div>
    </form>
  );
}
