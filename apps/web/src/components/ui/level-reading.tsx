import { formatLength, levelPosition, type LevelBands, type UnitPreference } from '@rinkwright/core';

// A reading is always its number, its band word and its place on a scale that shows the band limits, so that
// "just inside" and "dead level" never look the same. Each band pairs its colour with a shape.

const BAND = {
  true: { word: 'True', color: 'var(--color-band-true)' },
  fair: { word: 'Fair', color: 'var(--color-band-fair)' },
  off: { word: 'Off', color: 'var(--color-band-off)' },
} as const;

export function BandIcon({ band, size = 16 }: { band: keyof typeof BAND; size?: number }) {
  const color = BAND[band].color;
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0">
      {band === 'true' ? <circle cx="8" cy="8" r="6.5" fill={color} /> : null}
      {band === 'fair' ? (
        <>
          <circle cx="8" cy="8" r="6" fill="none" stroke={color} strokeWidth="2" />
          <path d="M8 2 A6 6 0 0 0 8 14 Z" fill={color} />
        </>
      ) : null}
      {band === 'off' ? <path d="M8 2 L14.5 14 L1.5 14 Z" fill="none" stroke={color} strokeWidth="2" strokeLinejoin="round" /> : null}
    </svg>
  );
}

export function BandWord({ band }: { band: keyof typeof BAND }) {
  return (
    // The colour is on the shape; the word stays in ink, so it keeps AA contrast whatever the band.
    <span className="inline-flex items-center gap-1 font-semibold text-ink">
      <BandIcon band={band} />
      {BAND[band].word}
    </span>
  );
}

/** The scale spans ±1.5 × the fair limit; the marker is clamped to its ends when a reading is further off. */
export function LevelScale({ readingNm, bands, unit, large = false }: { readingNm: number; bands: LevelBands; unit: UnitPreference; large?: boolean }) {
  const pos = levelPosition(readingNm, bands);
  const span = 1.5;
  const x = (fraction: number) => 50 + (Math.max(-span, Math.min(span, fraction)) / span) * 50;
  const trueAt = pos.trueLimitFraction;
  const shown = formatLength(readingNm, unit, 'reading');
  const limit = (nm: number) => formatLength(nm, unit, 'reading').value.replace('+', '');
  return (
    <figure className="w-full" aria-label={`Level reading ${shown.value} ${shown.unit}, ${BAND[pos.band].word}`}>
      <div className="flex items-baseline justify-between gap-3">
        <span className={`font-bold tabular-nums ${large ? 'text-4xl' : 'text-xl'}`}>
          {shown.value} <span className="text-sm font-medium text-ink-soft">{unit === 'in' ? 'thou' : 'hundredths mm'}</span>
        </span>
        <BandWord band={pos.band} />
      </div>
      <svg viewBox="0 0 100 14" className="mt-1 h-6 w-full" aria-hidden="true" preserveAspectRatio="none">
        {[
          [0, x(-1), 'off'],
          [x(-1), x(-trueAt), 'fair'],
          [x(-trueAt), x(trueAt), 'true'],
          [x(trueAt), x(1), 'fair'],
          [x(1), 100, 'off'],
        ].map(([from, to, band], i) => (
          <rect key={i} x={from} y="4" width={Number(to) - Number(from)} height="6" fill={`var(--color-band-${band})`} opacity={band === 'true' ? 0.55 : 0.35} />
        ))}
        <line x1="50" y1="2" x2="50" y2="12" stroke="var(--color-ink)" strokeWidth="0.4" />
        <line x1={x(pos.signedFraction)} y1="0" x2={x(pos.signedFraction)} y2="14" stroke="var(--color-ink)" strokeWidth="1.6" />
      </svg>
      <figcaption className="flex justify-between text-xs text-ink-soft tabular-nums">
        <span>−{limit(bands.fairNm)}</span>
        <span>true ±{limit(bands.trueNm)}</span>
        <span>+{limit(bands.fairNm)}</span>
      </figcaption>
    </figure>
  );
}
