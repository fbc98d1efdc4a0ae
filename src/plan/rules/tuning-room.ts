/**
 * Room for destination tuning at the interaction point. The gate stage tunes the destination's
 * offset from the exact crossing on both sides of it, up to one minimum splitting past it
 * (src/gate/design.ts, DESIGN_DEFAULTS.offsetWindow); a crossing at the very end of the mover's
 * range (typically the bottom sweet spot, where the parking cost's dephasing term vanishes)
 * leaves no room past it, and the huge excursion to it makes every ramp leak more. So a crossing
 * counts as reachable only when it lies at least one bare splitting 2 g_c (README physics conventions sec. 2)
 * inside the mover's range on the far side of its excursion: above the range's bottom for a
 * mover that moves down, below its top for one that moves up. Our choice, matched to the gate
 * stage's offset window.
 */
export interface FrequencyRange {
  lo: number;
  hi: number;
}

/** The room the crossing needs past it: one bare splitting 2 g_c (GHz). */
export function tuningRoomGHz(crossingCouplingGHz: number): number {
  return 2 * Math.abs(crossingCouplingGHz);
}

/**
 * How much room past the crossing `toGHz` is missing (GHz; 0 when there is enough) for a mover
 * that leaves `fromGHz` inside `range`, with the crossing's bare coupling g_c.
 */
export function tuningRoomShortfall(range: FrequencyRange, fromGHz: number, toGHz: number, crossingCouplingGHz: number): number {
  const room = tuningRoomGHz(crossingCouplingGHz);
  const past = toGHz <= fromGHz ? toGHz - range.lo : range.hi - toGHz;
  return Math.max(0, room - past);
}
