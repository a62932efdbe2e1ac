import type { LevelingAdvice, StationDetail, UnitPreference } from '@rinkwright/core';
import { LevelScale } from '../../../components/ui/level-reading';
import { adjustText, readingText } from './typed';

// The advice in plain words: what to do, how sure it is, and what it rests on. The numbers are the core's; this
// only words them, in the station's adjusting unit and the rink's reading unit.

export const adviceOf = (detail: StationDetail) => detail.advice as unknown as LevelingAdvice;

/** The advised amount in thousandths of the station's unit, when there is one to log. */
export function advisedMilli(detail: StationDetail): number | null {
  const advice = adviceOf(detail);
  return advice.kind === 'advise' ? Math.round(advice.turns * 1000) : null;
}

function responseWords(advice: Extract<LevelingAdvice, { kind: 'advise' | 'level' }>, detail: StationDetail, unit: UnitPreference) {
  const per = detail.station.adjustUnit === 'mm' ? 'mm' : 'turn';
  const response = `${readingText(advice.responseNmPerTurn, unit)} per ${per}`;
  return advice.responseSource === 'fit'
    ? `this station's own response, ${response}, fitted to its ${advice.fit?.n ?? 'logged'} adjustments with readings before and after`
    : `the rink's default response, ${response}, until this station has three adjustments with readings before and after`;
}

export function LevelingAdviceView({ detail, unit }: { detail: StationDetail; unit: UnitPreference }) {
  const advice = adviceOf(detail);
  const adjustUnit = detail.station.adjustUnit;
  const step = adjustText(detail.station.adjustStepMilli, adjustUnit).replace(/^\+/, '');
  const verb = adjustUnit === 'mm' ? 'Move the blade holder' : 'Turn the adjusting screw';

  if (advice.kind === 'not_enough_data') {
    return (
      <div className="space-y-2">
        <p className="text-xl font-bold">Not enough readings</p>
        <p className="text-sm text-ink-soft tabular-nums">
          {advice.readingsCount} reading{advice.readingsCount === 1 ? '' : 's'} since the last adjustment; the advice needs at least {advice.minReadings}. Take check readings or
          keep sharpening, and it appears here.
        </p>
      </div>
    );
  }

  const mean = (
    <div className="rounded-lg bg-frost p-3">
      <p className="mb-1 text-xs font-semibold text-ink-soft">Mean of the last {advice.readingsCount} readings since the last adjustment</p>
      <LevelScale readingNm={Math.round(advice.meanNm)} bands={detail.bands} unit={unit} />
    </div>
  );

  if (advice.kind === 'too_noisy') {
    const why =
      advice.reason === 'response_fit'
        ? `this station's own adjustments do not yet agree on how far a turn moves the readings${
            advice.relativeStdErr === null ? '' : ` (its response is known only to ±${Math.round(advice.relativeStdErr * 100)} %, and the advice needs ±${Math.round(advice.maxRelativeStdErr * 100)} % or better)`
          }. Log each adjustment with a few check readings before and after it.`
        : `the recent readings scatter too widely to tell their mean from level (± ${readingText(advice.stdErrMeanNm, unit).replace(/^\+/, '')} on the mean). Take more check readings on one blade before adjusting.`;
    return (
      <div className="space-y-3">
        <p className="text-xl font-bold">Too noisy to advise</p>
        <p className="text-sm">Rinkwright does not advise a turn because {why}</p>
        {mean}
      </div>
    );
  }

  if (advice.kind === 'level') {
    return (
      <div className="space-y-3">
        <p className="text-xl font-bold">Level: no change</p>
        <p className="text-sm text-ink-soft">
          The recent mean is within half a step ({step}) of level, so no turn would bring it closer. Based on {responseWords(advice, detail, unit)}.
        </p>
        {mean}
      </div>
    );
  }

  const uncertainty = Math.abs(advice.uncertaintyTurns).toFixed(2);
  return (
    <div className="space-y-3">
      <p className="text-2xl font-extrabold tabular-nums">
        {verb}{' '}
        <span className="whitespace-nowrap">
          {adjustText(Math.round(advice.turns * 1000), adjustUnit)} <span className="font-semibold text-ink-soft">(± {uncertainty})</span>
        </span>
      </p>
      <p className="text-sm">
        That is {Math.abs(advice.steps)} step{Math.abs(advice.steps) === 1 ? '' : 's'} of {step}, expected to bring the mean to {readingText(Math.round(advice.predictedMeanNm), unit)}. The ± is one
        standard error from the scatter of the readings{advice.responseSource === 'fit' ? ' and of the fitted response' : ''}: the right amount is likely within it.
      </p>
      <p className="text-sm text-ink-soft">Based on {responseWords(advice, detail, unit)}.</p>
      {mean}
    </div>
  );
}
