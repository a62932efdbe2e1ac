import type { LevelBand } from '@rinkwright/core';
import { BandIcon } from '../../../components/ui/level-reading';

const WORD: Record<LevelBand, string> = { true: 'True', fair: 'Fair', off: 'Off' };

/**
 * A band's icon (its colour and shape) with its word in ink: the amber of "fair" is too light for small text on
 * white (about 3.6:1), so in tables and legends the colour stays on the icon and the word stays legible.
 */
export function BandName({ band, lower = false }: { band: LevelBand; lower?: boolean }) {
  return (
    <span className="inline-flex items-center gap-1 font-semibold">
      <BandIcon band={band} />
      {lower ? WORD[band].toLowerCase() : WORD[band]}
    </span>
  );
}
