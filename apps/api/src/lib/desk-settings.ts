import { deskSettings, scoped } from '@rinkwright/db';
import type { DeskSettings } from '@rinkwright/core';

// A rink's counter settings, shared by the station and ticket features. Until a manager saves their own,
// a rink works with these defaults.
export const DEFAULT_DESK_SETTINGS: DeskSettings = {
  // 0.001" true and 0.002" fair: a skater can feel about 0.002"; 0.001" or less is a common target
  // (trade-facts.md, common practice). Precision bands halve both.
  trueNm: 25_400,
  fairNm: 50_800,
  precisionTrueNm: 12_700,
  precisionFairNm: 25_400,
  // A starting guess of 0.001" per turn of the adjusting screw, replaced by each station's own fit.
  defaultResponseNmPerTurn: 25_400,
  // A pair takes about 5–10 minutes at the counter (trade-facts.md, common practice).
  defaultMinutesPerPair: 8,
  ewmaLambdaMilli: 200,
  ewmaKMilli: 3000,
};

export async function readDeskSettings(tenantId: string): Promise<DeskSettings> {
  const [row] = await scoped(tenantId).find(deskSettings, { limit: 1 });
  if (!row) return DEFAULT_DESK_SETTINGS;
  const { tenantId: _tenant, updatedAt: _at, ...settings } = row;
  return settings;
}

export async function saveDeskSettings(tenantId: string, settings: DeskSettings): Promise<void> {
  const scope = scoped(tenantId);
  const changed = await scope.update(deskSettings, { ...settings, updatedAt: new Date() }, scope.filter(deskSettings));
  if (changed === 0) await scope.insert(deskSettings, { ...settings, updatedAt: new Date() });
}
