import type { LevelBand, StationDetail } from '@rinkwright/core';
import { BandName } from './band-name';

const BAR: Record<LevelBand, string> = { true: 'bg-band-true', fair: 'bg-band-fair', off: 'bg-band-off' };

export function BandMix({ mix }: { mix: StationDetail['bandMix'] }) {
  const total = mix.true + mix.fair + mix.off;
  const share = (count: number) => (total === 0 ? 0 : count / total);
  const percent = new Intl.NumberFormat(undefined, { style: 'percent', maximumFractionDigits: 0 });
  return (
    <div>
      <table className="w-full text-sm">
        <caption className="sr-only">Readings in each level band</caption>
        <thead className="sr-only">
          <tr>
            <th scope="col">Band</th>
            <th scope="col">Readings</th>
            <th scope="col">Share</th>
            <th scope="col">Bar</th>
          </tr>
        </thead>
        <tbody>
          {(['true', 'fair', 'off'] as const).map((band) => (
            <tr key={band} className="border-b border-rule/60 last:border-0">
              <th scope="row" className="w-20 py-2 text-left font-normal">
                <BandName band={band} />
              </th>
              <td className="w-14 py-2 text-right text-lg font-bold tabular-nums">{mix[band]}</td>
              <td className="w-16 py-2 pr-3 text-right text-ink-soft tabular-nums">{percent.format(share(mix[band]))}</td>
              <td className="py-2" aria-hidden="true">
                <div className="h-3 w-full rounded-full bg-glacier">
                  <div className={`h-3 rounded-full ${BAR[band]}`} style={{ width: `${share(mix[band]) * 100}%` }} />
                </div>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-2 text-sm text-ink-soft">
        {total === 0 ? 'No readings yet.' : `The latest ${total} readings: the first reading of each blade and every check reading.`}
      </p>
    </div>
  );
}
