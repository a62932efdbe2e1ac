// Hollow geometry: the radius ground across the blade bottom, seen as a circular segment whose chord is the blade
// width. Inputs and outputs are nanometres; depths and radii come back as whole nanometres like every stored
// length, which is far below anything a gauge can tell apart.

function assertPositive(value: number, what: string): void {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`${what} must be a positive length`);
}

function assertHollowFits(radiusNm: number, widthNm: number): void {
  assertPositive(radiusNm, 'The radius of hollow');
  assertPositive(widthNm, 'The blade width');
  if (widthNm / 2 > radiusNm) throw new RangeError('The blade is wider than the hollow\u2019s diameter: no such hollow fits it');
}

// The sagitta written as (w/2)² / (r + √(r² − (w/2)²)) rather than r − √(…): the same value without subtracting
// two nearly equal numbers. The plain form loses about four of sixteen digits on a 1" hollow across a speed
// blade; harmless at whole nanometres, but the stable form costs nothing and keeps the inverse checks tight.
function sagitta(radiusNm: number, widthNm: number): number {
  assertHollowFits(radiusNm, widthNm);
  const half = widthNm / 2;
  return (half * half) / (radiusNm + Math.sqrt(radiusNm * radiusNm - half * half));
}

/** Depth of the hollow between the two edges: d = r − √(r² − (w/2)²). */
export function hollowDepth(radiusNm: number, widthNm: number): number {
  return Math.round(sagitta(radiusNm, widthNm));
}

function radiusFor(depthNm: number, widthNm: number): number {
  assertPositive(depthNm, 'The hollow depth');
  assertPositive(widthNm, 'The blade width');
  const half = widthNm / 2;
  // Deeper than half the width would be more than a half circle, which no wheel can grind across a blade.
  if (depthNm > half) throw new RangeError('A hollow cannot be deeper than half the blade width');
  return (depthNm * depthNm + half * half) / (2 * depthNm);
}

/** The radius of hollow that gives this depth on this width: r = (d² + (w/2)²) / 2d. */
export function equivalentRadius(depthNm: number, widthNm: number): number {
  return Math.round(radiusFor(depthNm, widthNm));
}

/**
 * The radius that gives on a blade of `toWidthNm` the depth that `radiusNm` gives on `fromWidthNm`: what to dress
 * for a figure blade so it bites like the skater's usual hollow on a hockey runner. The depth is carried unrounded
 * between the two steps so that the answer does not pick up a rounding of its own.
 */
export function equivalentHollow(radiusNm: number, fromWidthNm: number, toWidthNm: number): number {
  return Math.round(radiusFor(sagitta(radiusNm, fromWidthNm), toWidthNm));
}

/** Angle between the blade side and the hollow's tangent at the edge: asin(w / 2r), in degrees. */
export function edgeAngleDeg(radiusNm: number, widthNm: number): number {
  assertHollowFits(radiusNm, widthNm);
  return (Math.asin(widthNm / (2 * radiusNm)) * 180) / Math.PI;
}
