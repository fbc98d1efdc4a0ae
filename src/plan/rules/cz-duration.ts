/**
 * The CZ duration model every stage shares: `fluxlane check` and `plan --no-pulses` (the rule
 * cz-duration, ./cz-evaluate.ts), the designer's time budget and the designed gate's slot
 * (src/plan/pulses.ts), `fluxlane verify`, and the slot time base of the waveform files
 * (src/report/waveform-files.ts):
 *
 *   shortest gate    1 / (2 g_c)                 the speed limit of a CZ on the crossing: one full
 *                                                11 -> 20 -> 11 cycle at its bare coupling g_c
 *                                                (README physics conventions sec. 2); the ramps
 *                                                add conditional phase too, so they are not
 *                                                counted on top of it
 *                    + 2 d                       the flux line's settling at both ends of the
 *                                                waveform (src/gate/pulse.ts lineDelayNs)
 *                    + 2 / f_s                   the sample grid: the waveform is rounded up to it
 *                                                and keeps one spare interval (src/gate/design.ts)
 *   spectator moves  2 ceil(t_ramp f_s) / f_s    each moved spectator goes out on the plan's ramp
 *                                                before the mover starts and back after it ends,
 *                                                on the AWG grid
 *   slot             gate + spectator moves      (moves only when a spectator moves)
 *
 * The shortest gate is a lower bound of what the designer achieves: its designs spend 1.02 to
 * 1.38 times 1 / (2 g_c) in their ramps and hold on the four demos (plans of 2026-12), so an
 * edge check finds too slow is too slow for the designer too. Units: ns, GHz.
 */
import { lineDelayNs } from '../../gate/pulse.js';
import type { Rules } from '../../layout/types.js';

type TimingRules = Pick<Rules, 'sampleRateGHz' | 'fluxBandwidthGHz'>;

/** The shortest CZ on a crossing with bare coupling g_c, as realised on the AWG grid through the line (ns). */
export function shortestGateNs(crossingCouplingGHz: number, rules: TimingRules): number {
  return 1 / (2 * crossingCouplingGHz) + 2 * lineDelayNs(rules.sampleRateGHz, rules.fluxBandwidthGHz) + 2 / rules.sampleRateGHz;
}

/** One spectator move (out or back) on the AWG grid: the plan's ramp rounded up to whole samples (ns). */
export function spectatorMoveNs(rampNs: number, rules: Pick<Rules, 'sampleRateGHz'>): number {
  return Math.ceil(rampNs * rules.sampleRateGHz - 1e-9) / rules.sampleRateGHz;
}

/** The time spectator moves add to a gate's slot: two moves when any spectator moves, else 0 (ns). */
export function spectatorMovesNs(spectatorsMove: boolean, rampNs: number, rules: Pick<Rules, 'sampleRateGHz'>): number {
  return spectatorsMove ? 2 * spectatorMoveNs(rampNs, rules) : 0;
}

/** The slot of a gate of `gateNs`: the gate plus the spectator moves (ns). */
export function slotNs(gateNs: number, spectatorsMove: boolean, rampNs: number, rules: Pick<Rules, 'sampleRateGHz'>): number {
  return gateNs + spectatorMovesNs(spectatorsMove, rampNs, rules);
}
