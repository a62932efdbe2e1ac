import { useState } from 'react';
import type { LevelBands, RinkSummary, SharpeningRow } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { formatDateTime } from '../../../lib/format';
import { lengthInput, parseLength, showLength } from '../../../lib/units';
import { useCounterWrite, writes } from '../api/counter-writes';
import { ReadingInputs, readingsOf, type ReadingDraft } from './reading-inputs';
import { ReadingList } from './reading-list';

function RerunForm({ rink, sharpening, onDone }: { rink: RinkSummary; sharpening: SharpeningRow; onDone: () => void }) {
  const [draft, setDraft] = useState<ReadingDraft>({ left: '', right: '' });
  const [problem, setProblem] = useState('');
  const { run, busy } = useCounterWrite(rink.slug);
  async function submit() {
    const { readings, error } = readingsOf(draft, 'level', rink.unitPreference);
    if (error || readings.length === 0) return setProblem(error ?? 'Enter at least one reading');
    try {
      await run(writes.addReadings(rink.slug, sharpening.id, { readings }, 'Re-run readings'));
      onDone();
    } catch (e) {
      setProblem(e instanceof Error ? e.message : 'Not saved');
    }
  }
  return (
    <form className="mt-3 grid gap-3 sm:grid-cols-3 sm:items-end" onSubmit={(e) => (e.preventDefault(), void submit())} aria-label="Re-run readings">
      <ReadingInputs draft={draft} onChange={setDraft} mode="level" unit={rink.unitPreference} idPrefix={`rerun-${sharpening.id}`} />
      <Button type="submit" busy={busy}>
        Add re-run readings
      </Button>
      <div className="sm:col-span-3">
        <Alert>{problem}</Alert>
      </div>
    </form>
  );
}

function CorrectionForm({ rink, sharpening, onDone }: { rink: RinkSummary; sharpening: SharpeningRow; onDone: () => void }) {
  const unit = rink.unitPreference;
  const [reason, setReason] = useState('');
  const [passes, setPasses] = useState(String(sharpening.passes));
  const [hollow, setHollow] = useState(lengthInput(sharpening.hollowNm, unit, 'hollow'));
  const [width, setWidth] = useState(lengthInput(sharpening.bladeWidthNm, unit, 'width'));
  const [problem, setProblem] = useState('');
  const { run, busy } = useCounterWrite(rink.slug);
  async function submit() {
    const hollowNm = parseLength(hollow, unit);
    const bladeWidthNm = parseLength(width, unit);
    if (reason.trim().length < 3) return setProblem('Say what was wrong');
    if (!hollowNm || !bladeWidthNm || !(Number(passes) >= 1)) return setProblem('Give the hollow, the blade width and the passes');
    try {
      await run(writes.correct(rink.slug, sharpening.id, { reason, hollowNm, bladeWidthNm, passes: Number(passes) }, 'Correction'));
      onDone();
    } catch (e) {
      setProblem(e instanceof Error ? e.message : 'Not saved');
    }
  }
  return (
    <form className="mt-3 grid gap-3 sm:grid-cols-4 sm:items-end" onSubmit={(e) => (e.preventDefault(), void submit())} aria-label="Correct this record">
      <TextField label="What was wrong" value={reason} onChange={(e) => setReason(e.target.value)} className="sm:col-span-4" />
      <TextField label={`Hollow (${unit})`} value={hollow} onChange={(e) => setHollow(e.target.value)} />
      <TextField label={`Blade width (${unit})`} value={width} onChange={(e) => setWidth(e.target.value)} />
      <TextField label="Passes" value={passes} onChange={(e) => setPasses(e.target.value)} inputMode="numeric" />
      <Button type="submit" busy={busy}>
        Save the correction
      </Button>
      <div className="sm:col-span-4">
        <Alert>{problem}</Alert>
      </div>
    </form>
  );
}

/** One logged sharpening with its readings; corrections show under the record they correct. */
export function SharpeningCard({ rink, sharpening, corrections, bands, canWork }: { rink: RinkSummary; sharpening: SharpeningRow; corrections: SharpeningRow[]; bands: LevelBands | null; canWork: boolean }) {
  const [open, setOpen] = useState<'rerun' | 'correct' | null>(null);
  const unit = rink.unitPreference;
  const line = (s: SharpeningRow) =>
    `${showLength(s.hollowNm, unit, 'hollow')} hollow · ${s.passes} pass${s.passes === 1 ? '' : 'es'} · ${showLength(s.bladeWidthNm, unit, 'width')} blade · ${s.stationName}`;
  return (
    <div className="rounded-lg border border-rule p-3">
      <p className="font-semibold tabular-nums">{line(sharpening)}</p>
      <p className="mb-2 text-xs text-ink-soft">
        Logged by {sharpening.technician} · {formatDateTime(sharpening.doneAt, rink.timeZone)}
      </p>
      {corrections.map((c) => (
        <div key={c.id} className="mb-2 rounded-lg border-l-4 border-amber bg-amber-50 p-2 text-sm">
          <p className="font-semibold">Corrected to: {line(c)}</p>
          <p className="text-ink-soft">
            “{c.correctionReason}” · {c.technician} · {formatDateTime(c.doneAt, rink.timeZone)}
          </p>
        </div>
      ))}
      <ReadingList readings={sharpening.readings} bands={bands} unit={unit} timeZone={rink.timeZone} />
      {canWork ? (
        <div className="mt-2 flex flex-wrap gap-2">
          <Button tone="quiet" onClick={() => setOpen(open === 'rerun' ? null : 'rerun')}>
            Re-run reading
          </Button>
          <Button tone="quiet" onClick={() => setOpen(open === 'correct' ? null : 'correct')}>
            Correct this record
          </Button>
        </div>
      ) : null}
      {open === 'rerun' ? <RerunForm rink={rink} sharpening={sharpening} onDone={() => setOpen(null)} /> : null}
      {open === 'correct' ? <CorrectionForm rink={rink} sharpening={sharpening} onDone={() => setOpen(null)} /> : null}
    </div>
  );
}
