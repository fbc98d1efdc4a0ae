/**
 * The collision rules of fluxlane as data (README physics conventions sec. 5; common practice,
 * thresholds configurable in the layout's `rules:` with defaults in shared/rules.json).
 *
 * Each rule is named after the transitions it compares: "01-01" is f01 of one qubit against f01
 * of another, "01-12" f01 against f12, "11-20" the |11> <-> |20> crossing (the first qubit's f12
 * against the second's f01), "11-02" the |11> <-> |02> crossing (the first's f01 against the
 * second's f12). Idle rules hold at the parking frequencies; `cz-` rules hold during a CZ on one
 * edge (mover A moving from parking to the interaction frequency and back, partner B static,
 * spectators S = the mover's other neighbours); `cz-parked-` rules hold for a spectator moved to
 * a temporary frequency during a gate (spectator parking); `cz-swept-` rules limit the
 * Landau-Zener transfer 1 - exp(-4 pi^2 g^2 / v) through a crossing a moving qubit passes.
 *
 * The evaluation functions live beside this table: idle rules in ./idle-evaluate.ts (exact, on a
 * plan) and ./idle-blockers.ts (the same conditions as blocked intervals for the search), CZ
 * rules in ./cz-evaluate.ts. Adding a rule: DEVELOPERS.md, "How to add a collision rule".
 */
import type { Rules } from '../../layout/types.js';

export type RuleName =
  | 'window'
  | '01-01'
  | '01-12'
  | 'zz'
  | 'next-01-01'
  | 'tls'
  | 'readout'
  | 'cz-range'
  | 'cz-duration'
  | 'cz-spectator-01-01'
  | 'cz-spectator-11-20'
  | 'cz-spectator-11-02'
  | 'cz-spectator-21-12'
  | 'cz-spectator-21-30'
  | 'cz-excursion'
  | 'gate-error'
  | 'spectator-leakage'
  | 'idle-error'
  | 'cz-next-01-01'
  | 'cz-tls'
  | 'cz-readout'
  | 'cz-swept-01-01'
  | 'cz-swept-11-20'
  | 'cz-swept-11-02'
  | 'cz-swept-next-01-01'
  | 'cz-swept-tls'
  | 'cz-parked-01-01'
  | 'cz-parked-01-12'
  | 'cz-parked-next-01-01'
  | 'cz-parked-tls'
  | 'cz-parked-readout'
  | 'cz-design'
  | 'cz-crossing'
  | 'layer-conflict'
  | 'layer-index'
  | 'plan-claim'
  | 'margin';

export type RuleScope = 'idle' | 'cz' | 'plan' | 'crowding';

/** What the rule's value measures (sets the JSON unit: frequency -> Hz, time -> s). */
export type RuleQuantity = 'frequency' | 'probability' | 'time' | 'spreads' | 'none';

export interface CollisionRule {
  name: RuleName;
  scope: RuleScope;
  /** The transitions compared, in words. */
  transitions: string;
  /** The Rules field holding the threshold (null: the rule has no configurable threshold). */
  threshold: keyof Rules | null;
  /** How the value is compared: `min` (value must be >= threshold), `max` (<= threshold), `none`. */
  compare: 'min' | 'max' | 'none';
  quantity: RuleQuantity;
  doc: string;
  source: string;
}

const rule = (r: CollisionRule): CollisionRule => Object.freeze(r);

/** Every rule, in the order findings are reported. */
export const COLLISION_RULES: readonly CollisionRule[] = Object.freeze([
  rule({ name: 'window', scope: 'idle', transitions: 'parking f01 against the window and the tunable range', threshold: null, compare: 'none', quantity: 'frequency',
    doc: 'A qubit parks inside its window and inside its planning range (E_J/E_C >= 30 up to the sweet spot); a fixed `park` must lie there too.', source: 'layout contract' }),
  rule({ name: '01-01', scope: 'idle', transitions: 'f01_i vs f01_j, coupled neighbours', threshold: 'detuning0101GHz', compare: 'min', quantity: 'frequency',
    doc: 'Coupled neighbours at idle keep |f01_i - f01_j| >= detuning0101 (resonant exchange).', source: 'common practice' }),
  rule({ name: '01-12', scope: 'idle', transitions: 'f01_i vs f12_j and f12_i vs f01_j, coupled neighbours', threshold: 'detuning0112GHz', compare: 'min', quantity: 'frequency',
    doc: 'Coupled neighbours at idle keep |f01_i - f12_j| and |f12_i - f01_j| >= detuning0112 (the 11-02 and 11-20 crossings, where ZZ diverges).', source: 'common practice' }),
  rule({ name: 'zz', scope: 'idle', transitions: 'E_11 - E_10 - E_01 + E_00, coupled neighbours (exact dressed levels)', threshold: 'zzLimitGHz', compare: 'max', quantity: 'frequency',
    doc: 'The exact static ZZ of every coupled pair at its parking point stays within zzLimit.', source: 'common practice' }),
  rule({ name: 'next-01-01', scope: 'idle', transitions: 'f01_i vs f01_k, qubits sharing a neighbour', threshold: 'detuningNext0101GHz', compare: 'min', quantity: 'frequency',
    doc: 'Next-nearest neighbours at idle keep |f01_i - f01_k| >= detuningNext0101 (mediated exchange, drive crosstalk).', source: 'common practice' }),
  rule({ name: 'tls', scope: 'idle', transitions: 'f01 vs a listed two-level defect', threshold: 'tlsClearanceGHz', compare: 'min', quantity: 'frequency',
    doc: 'A qubit parks at least the defect width plus tlsClearance away from each listed defect; value is |f01 - f_TLS| - width.', source: 'common practice' }),
  rule({ name: 'readout', scope: 'idle', transitions: 'f01 vs its readout resonator', threshold: 'readoutDetuningGHz', compare: 'min', quantity: 'frequency',
    doc: 'A qubit parks at least readoutDetuning away from its readout resonator.', source: 'common practice' }),
  rule({ name: 'cz-range', scope: 'cz', transitions: 'the mover f01 at the 11-20 or 11-02 crossing vs its tunable range', threshold: null, compare: 'none', quantity: 'frequency',
    doc: 'The interaction frequency of the chosen crossing lies inside the mover\'s planning range, at least one bare splitting 2 g_c from its far end (room to tune the destination past the crossing; our choice, src/plan/rules/tuning-room.ts).', source: 'README physics conventions sec. 2' }),
  rule({ name: 'cz-duration', scope: 'cz', transitions: '1/(2 g_c) at the crossing plus ramps', threshold: 'maxGateNs', compare: 'max', quantity: 'time',
    doc: 'The shortest CZ on the crossing (one full 11 -> 20 -> 11 cycle, 1/(2 g_c), plus ramps in and out, the flux line\'s settling and the sample grid, plus the ramps of any spectator moved out of the way) fits in maxGate.', source: 'README physics conventions sec. 2 (two-level Rabi formula)' }),
  rule({ name: 'cz-spectator-01-01', scope: 'cz', transitions: 'excited qubit f01 at the gate vs spectator f01 (|10> <-> |01>)', threshold: 'spectatorAdmixture', compare: 'max', quantity: 'probability',
    doc: 'During a CZ the admixture (g_c / Delta)^2 of the excited qubit\'s 0-1 and each spectator\'s 0-1 transition stays within spectatorAdmixture (src/plan/rules/spectator-admixture.ts).', source: 'README physics conventions sec. 5; three-transmon simulations' }),
  rule({ name: 'cz-spectator-11-20', scope: 'cz', transitions: 'excited qubit f12 at the gate vs spectator f01 (|11> <-> |20>)', threshold: 'spectatorAdmixture', compare: 'max', quantity: 'probability',
    doc: 'During a CZ the admixture of the excited qubit\'s 1-2 and each spectator\'s 0-1 transition (coupling about sqrt2 g) stays within spectatorAdmixture.', source: 'README physics conventions sec. 5' }),
  rule({ name: 'cz-spectator-11-02', scope: 'cz', transitions: 'excited qubit f01 at the gate vs spectator f12 (|11> <-> |02>)', threshold: 'spectatorAdmixture', compare: 'max', quantity: 'probability',
    doc: 'During a CZ the admixture of the excited qubit\'s 0-1 and each spectator\'s 1-2 transition stays within spectatorAdmixture.', source: 'README physics conventions sec. 5' }),
  rule({ name: 'cz-spectator-21-12', scope: 'cz', transitions: 'excited qubit f12 vs spectator f12 (|21> <-> |12>), when the gate populates |2>', threshold: 'spectatorAdmixture', compare: 'max', quantity: 'probability',
    doc: 'During a CZ that populates |2> of a qubit, the admixture of its 1-2 and each of its spectators\' 1-2 transition (coupling about 2 g) stays within spectatorAdmixture.', source: 'derived (charge matrix elements of the transmon ladder); three-transmon simulations' }),
  rule({ name: 'cz-spectator-21-30', scope: 'cz', transitions: 'excited qubit f23 vs spectator f01 (|21> <-> |30>), when the gate populates |2>', threshold: 'spectatorAdmixture', compare: 'max', quantity: 'probability',
    doc: 'During a CZ that populates |2> of a qubit, the admixture of its 2-3 and each of its spectators\' 0-1 transition (coupling about sqrt3 g) stays within spectatorAdmixture.', source: 'derived (charge matrix elements of the transmon ladder); three-transmon simulations' }),
  rule({ name: 'cz-excursion', scope: 'cz', transitions: 'the mover\'s flux excursion from parking to the interaction point', threshold: 'maxFluxExcursion', compare: 'max', quantity: 'none',
    doc: 'A CZ moves its mover at most maxFluxExcursion (Phi0) from its parking flux (the flux line\'s current limit).', source: 'the lab\'s wiring' }),
  rule({ name: 'cz-next-01-01', scope: 'cz', transitions: 'mover f01 at the interaction point vs f01 of a qubit sharing a neighbour with it', threshold: 'detuningNext0101GHz', compare: 'min', quantity: 'frequency',
    doc: 'During a CZ the interaction frequency keeps detuningNext0101 from the mover\'s next-nearest neighbours.', source: 'common practice' }),
  rule({ name: 'cz-tls', scope: 'cz', transitions: 'mover f01 at the interaction point vs its listed defects', threshold: 'tlsClearanceGHz', compare: 'min', quantity: 'frequency',
    doc: 'The interaction frequency keeps width + tlsClearance from each defect of the mover.', source: 'common practice' }),
  rule({ name: 'cz-readout', scope: 'cz', transitions: 'the band the mover sweeps vs its readout resonator', threshold: 'readoutDetuningGHz', compare: 'min', quantity: 'frequency',
    doc: 'The whole excursion of the mover keeps readoutDetuning from its readout resonator.', source: 'common practice' }),
  rule({ name: 'cz-swept-01-01', scope: 'cz', transitions: 'a moving qubit\'s f01 sweeping through a coupled qubit\'s f01', threshold: 'sweptTransferLimit', compare: 'max', quantity: 'probability',
    doc: 'Landau-Zener transfer 1 - exp(-4 pi^2 g^2 / v) through each 01-10 crossing passed on the way to the interaction point (g = exchange coupling there, v = sweep rate).', source: 'Landau 1932, Zener 1932; README physics conventions sec. 5' }),
  rule({ name: 'cz-swept-11-20', scope: 'cz', transitions: 'a moving qubit\'s f12 sweeping through a coupled qubit\'s f01', threshold: 'sweptTransferLimit', compare: 'max', quantity: 'probability',
    doc: 'Landau-Zener transfer through each 11-20 crossing passed on the way (coupling G |n12| |n01|, about sqrt2 g).', source: 'Landau 1932, Zener 1932' }),
  rule({ name: 'cz-swept-11-02', scope: 'cz', transitions: 'a moving qubit\'s f01 sweeping through a coupled qubit\'s f12', threshold: 'sweptTransferLimit', compare: 'max', quantity: 'probability',
    doc: 'Landau-Zener transfer through each 11-02 crossing passed on the way (coupling G |n01| |n12|).', source: 'Landau 1932, Zener 1932' }),
  rule({ name: 'cz-swept-next-01-01', scope: 'cz', transitions: 'a moving qubit\'s f01 sweeping through a next-nearest neighbour\'s f01', threshold: 'sweptTransferLimit', compare: 'max', quantity: 'probability',
    doc: 'Landau-Zener transfer through a next-nearest neighbour, with the mediated coupling sum_S g_iS g_kS / (f - f_S) through the shared neighbours (src/plan/mediated-coupling.ts).', source: 'Landau 1932, Zener 1932; Yan et al., Phys. Rev. Applied 10, 054062 (2018)' }),
  rule({ name: 'cz-swept-tls', scope: 'cz', transitions: 'a moving qubit\'s f01 sweeping through one of its defects', threshold: 'sweptTransferLimit', compare: 'max', quantity: 'probability',
    doc: 'Landau-Zener transfer into a listed defect passed on the way, with the defect coupling g = width / 2 (the layout\'s width is the half-width 2g of the splitting).', source: 'Landau 1932, Zener 1932; layout contract (QubitLayout.tls)' }),
  rule({ name: 'cz-parked-01-01', scope: 'cz', transitions: 'a parked spectator\'s f01 vs its other neighbours\' f01', threshold: 'detuning0101GHz', compare: 'min', quantity: 'frequency',
    doc: 'A spectator moved out of the way keeps the idle 01-01 rule with its other neighbours at its temporary frequency.', source: 'common practice' }),
  rule({ name: 'cz-parked-01-12', scope: 'cz', transitions: 'a parked spectator\'s f01/f12 vs its other neighbours\' f12/f01', threshold: 'detuning0112GHz', compare: 'min', quantity: 'frequency',
    doc: 'A spectator moved out of the way keeps the idle 01-12 rule with its other neighbours.', source: 'common practice' }),
  rule({ name: 'cz-parked-next-01-01', scope: 'cz', transitions: 'a parked spectator\'s f01 vs its next-nearest neighbours\' f01', threshold: 'detuningNext0101GHz', compare: 'min', quantity: 'frequency',
    doc: 'A spectator moved out of the way keeps detuningNext0101 from its next-nearest neighbours (the mover excepted: its conditions are the cz-spectator rules).', source: 'common practice' }),
  rule({ name: 'cz-parked-tls', scope: 'cz', transitions: 'a parked spectator\'s f01 vs its defects', threshold: 'tlsClearanceGHz', compare: 'min', quantity: 'frequency',
    doc: 'A spectator moved out of the way keeps width + tlsClearance from its defects.', source: 'common practice' }),
  rule({ name: 'cz-parked-readout', scope: 'cz', transitions: 'a parked spectator\'s f01 vs its readout resonator', threshold: 'readoutDetuningGHz', compare: 'min', quantity: 'frequency',
    doc: 'A spectator moved out of the way keeps readoutDetuning from its readout resonator.', source: 'common practice' }),
  rule({ name: 'gate-error', scope: 'cz', transitions: 'the predicted error of a CZ (its whole budget)', threshold: 'gateErrorLimit', compare: 'max', quantity: 'probability',
    doc: 'The predicted average infidelity of each CZ (coherent, T1, white dephasing, quasi-static flux noise, spectators, swept crossings, spectator moves; src/plan/gate-budget.ts) stays within gateErrorLimit.', source: 'README physics conventions sec. 4' }),
  rule({ name: 'spectator-leakage', scope: 'cz', transitions: 'the leakage a CZ\'s spectators add (three-transmon simulations)', threshold: 'spectatorLeakageLimit', compare: 'max', quantity: 'probability',
    doc: 'The leakage the spectators of a designed CZ add, simulated as third transmons in |0> and |1>, stays within spectatorLeakageLimit.', source: 'src/budget/spectator-error.ts' }),
  rule({ name: 'idle-error', scope: 'idle', transitions: 'a qubit\'s predicted idle error over one reference cycle', threshold: 'idleErrorLimit', compare: 'max', quantity: 'probability',
    doc: 'Each qubit\'s predicted idle error over the reference cycle (T1, white and quasi-static 1/f dephasing, residual ZZ, thermal excitation; src/budget/idle-error.ts) stays within idleErrorLimit.', source: 'README physics conventions sec. 4' }),
  rule({ name: 'cz-design', scope: 'cz', transitions: 'the designed CZ pulse of an edge', threshold: 'maxGateNs', compare: 'none', quantity: 'none',
    doc: 'The gate stage found a CZ for the edge within maxGate (its reason is reported when it did not).', source: 'src/gate (designCzGate)' }),
  rule({ name: 'cz-crossing', scope: 'plan', transitions: 'the plan\'s interaction frequency vs the crossing recomputed from the parking frequencies', threshold: null, compare: 'none', quantity: 'frequency',
    doc: 'In a plan read back by `fluxlane verify`, each edge\'s interaction frequency minus its crossing offset matches the crossing at the plan\'s parking frequencies within 10 kHz (otherwise the gate was designed for another parking point).', source: 'fluxlane plan contract' }),
  rule({ name: 'layer-conflict', scope: 'plan', transitions: 'two gates in one layer', threshold: null, compare: 'none', quantity: 'none',
    doc: 'Gates in one parallel layer share no qubit (mover, partner or parked spectator) and no cz condition couples them (src/plan/layers.ts).', source: 'README physics conventions sec. 5' }),
  rule({ name: 'layer-index', scope: 'plan', transitions: 'the layer each gate is in', threshold: null, compare: 'none', quantity: 'none',
    doc: 'Each edge\'s layer index lies in 0 .. L-1 with no empty layer, the plan\'s list of layers agrees with the edges, and its layer summary with what the edges give (fluxlane verify).', source: 'fluxlane verify' }),
  rule({ name: 'plan-claim', scope: 'plan', transitions: 'a number the plan states vs the same number recomputed', threshold: null, compare: 'none', quantity: 'none',
    doc: 'Every number of the claim table (src/plan/verify-claims.ts: qubit spectra and coherence, ZZ, margins, a designed gate\'s duration, interaction point and metrics from its re-simulated waveform) agrees with its recomputation within the stated tolerance, and every waveform the plan names is there and starts at the mover\'s parking point (fluxlane verify).', source: 'fluxlane verify' }),
  rule({ name: 'margin', scope: 'crowding', transitions: 'smallest distance to any collision condition, in fabrication spreads', threshold: 'marginFlagSpreads', compare: 'min', quantity: 'spreads',
    doc: 'Flag (not a violation): a qubit whose smallest margin is below marginFlagSpreads expected frequency spreads (src/plan/crowding.ts).', source: 'common practice' }),
]);

const BY_NAME = new Map(COLLISION_RULES.map((r) => [r.name, r]));

export function ruleByName(name: RuleName): CollisionRule {
  const r = BY_NAME.get(name);
  if (!r) throw new RangeError(`unknown rule ${name}`);
  return r;
}

/** The threshold of a rule in internal units (GHz, ns, or a plain number), or null. */
export function thresholdOf(name: RuleName, rules: Rules): number | null {
  const field = ruleByName(name).threshold;
  if (field === null) return null;
  const v = rules[field];
  return typeof v === 'number' ? v : null;
}
