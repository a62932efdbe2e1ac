import { surfaceSpeedMps, surfaceSpeedSfpm, type StationDetail, type UnitPreference } from '@rinkwright/core';
import { Alert } from '../../../components/ui/feedback';
import { Stat } from '../../../components/ui/layout';
import { formatDate } from '../../../lib/format';
import { showLength } from '../../../lib/units';
import { wholeNumber } from './typed';

const oneDecimal = (n: number) => new Intl.NumberFormat(undefined, { maximumFractionDigits: 1, minimumFractionDigits: 1 }).format(n);

export function WheelLife({ detail, unit, timeZone }: { detail: StationDetail; unit: UnitPreference; timeZone: string }) {
  const wheel = detail.station.wheel;
  const life = detail.wheelLife;
  if (!wheel || !life) return <p className="text-sm text-ink-soft">No wheel mounted. Mount one below to follow its wear and speed.</p>;

  const rpm = detail.station.rpm;
  const ratedSfpm = life.maxRpm === null ? null : surfaceSpeedSfpm(wheel.diameterNm, life.maxRpm);
  const worn = wheel.diameterNewNm - wheel.minDiameterNm;
  const used = worn > 0 ? Math.min(1, Math.max(0, (wheel.diameterNewNm - wheel.diameterNm) / worn)) : 0;
  const days = life.daysLeft === null ? null : Math.floor(life.daysLeft);

  return (
    <div className="space-y-4">
      {life.atOrBelowMinimum ? <Alert>This wheel is at or below its minimum diameter. Take it out of service and mount a new one.</Alert> : null}
      {life.speedStatus === 'over' ? (
        <Alert>
          Over the wheel's rated speed: the station runs at {wholeNumber(rpm)} RPM and this wheel is rated for {life.maxRpm === null ? 'less' : `${wholeNumber(life.maxRpm)} RPM`}. Do not grind
          with it. Stop the station and fit a wheel rated for this speed, or have the speed corrected, per the machine maker's manual.
        </Alert>
      ) : null}
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        <Stat label="Passes left" value={life.passesLeft === null ? '—' : wholeNumber(life.passesLeft)} />
        <Stat label="Days left" value={days === null ? '—' : wholeNumber(days)} />
        <Stat label="Minimum by" value={<span className="text-lg">{life.predictedAt ? formatDate(life.predictedAt, timeZone) : '—'}</span>} />
      </dl>
      {life.passesLeft === null ? (
        <p className="text-sm text-ink-soft">The prediction needs a dressing logged with the diameter after it, and passes ground since mounting.</p>
      ) : null}
      <div>
        <div className="flex justify-between text-sm tabular-nums">
          <span>
            Diameter now <strong>{showLength(wheel.diameterNm, unit, 'diameter')}</strong>
          </span>
          <span className="text-ink-soft">
            new {showLength(wheel.diameterNewNm, unit, 'diameter')} · minimum {showLength(wheel.minDiameterNm, unit, 'diameter')}
          </span>
        </div>
        <div
          className="mt-1 h-3 w-full rounded-full bg-glacier"
          role="meter"
          aria-label="Wheel worn toward its minimum diameter"
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={Math.round(used * 100)}
          aria-valuetext={`${Math.round(used * 100)} % of the usable diameter used`}
        >
          <div className={`h-3 rounded-full ${used >= 0.9 ? 'bg-brick' : 'bg-steel'}`} style={{ width: `${used * 100}%` }} />
        </div>
        <p className="mt-1 text-xs text-ink-soft tabular-nums">
          {Math.round(used * 100)} % of the usable diameter used · {wholeNumber(wheel.passesSinceMount)} passes since mounting
          {life.wearPerPassNm !== null ? ` · ${showLength(life.wearPerPassNm * 1000, unit, 'diameter')} per 1,000 passes` : ''}
        </p>
      </div>
      <div className="rounded-lg bg-frost p-3 text-sm">
        <p className="font-bold">Surface speed</p>
        <p className="mt-1 tabular-nums">
          <strong className="text-lg">{wholeNumber(life.sfpm)} SFPM</strong>
          {unit === 'mm' ? ` (${oneDecimal(surfaceSpeedMps(wheel.diameterNm, rpm))} m/s)` : ''} at {wholeNumber(rpm)} RPM and the current diameter.
        </p>
        {life.speedStatus === 'unrated' ? (
          <p className="mt-1 font-semibold text-brick">No speed rating recorded for this wheel: read the marking on the wheel before running it.</p>
        ) : ratedSfpm !== null && life.maxRpm !== null ? (
          <p className={`mt-1 tabular-nums ${life.speedStatus === 'over' ? 'font-semibold text-brick' : ''}`}>
            {life.speedStatus === 'over' ? 'Above' : 'Within'} the wheel's rating: up to {wholeNumber(life.maxRpm)} RPM, {wholeNumber(ratedSfpm)} SFPM at this diameter.
          </p>
        ) : null}
      </div>
    </div>
  );
}
