/**
 * The device parameters a plan was made for, one definition (internal units): each qubit's
 * resolved transmon and coherence, its defects and readout resonator, each coupling's g. The
 * report stage writes them into plan.json (`qubits.<id>.device`, `edges[].gMax`); re-planning
 * (./replan/) and `fluxlane diff` compare an earlier plan's with the new layout's to say what was
 * measured differently.
 */
import type { PlanContext } from './context.js';
import type { TransmonSpec } from '../layout/types.js';

export type DeviceKind = 'frequency' | 'time' | 'temperature' | 'number';

export interface DeviceField {
  /** The plan.json key under `device`. */
  key: string;
  /** How it converts to SI (frequency: GHz -> Hz; time: ns -> s; temperature (K) and number: as is). */
  kind: DeviceKind;
  /** What it is, for messages ("maximum frequency"). */
  name: string;
  /** Its value for qubit i (internal units), undefined when the layout gives none. */
  of(ctx: PlanContext, i: number): number | undefined;
  /** True when the layout gives it directly (else it follows from the values it does give); absent: always given. */
  given?: (spec: TransmonSpec) => boolean;
}

export const DEVICE_FIELDS: readonly DeviceField[] = [
  { key: 'fMax', kind: 'frequency', name: 'maximum frequency', of: (c, i) => c.transmons[i].fMaxGHz, given: (t) => t.kind === 'frequencies' },
  { key: 'fMin', kind: 'frequency', name: 'minimum frequency', of: (c, i) => c.transmons[i].fMinGHz, given: (t) => t.kind === 'frequencies' && t.fMinGHz !== undefined },
  { key: 'anharmonicity', kind: 'frequency', name: 'anharmonicity at the maximum', of: (c, i) => c.transmons[i].anharmonicityMaxGHz, given: (t) => t.kind === 'frequencies' },
  { key: 'ec', kind: 'frequency', name: 'E_C', of: (c, i) => c.transmons[i].ecGHz, given: (t) => t.kind !== 'frequencies' },
  { key: 'ejMax', kind: 'frequency', name: 'E_J at zero flux', of: (c, i) => c.transmons[i].ejsGHz, given: (t) => t.kind === 'energies' },
  { key: 'asymmetry', kind: 'number', name: 'SQUID asymmetry', of: (c, i) => c.transmons[i].asymmetry, given: (t) => t.kind === 'energies' || t.asymmetry !== undefined },
  { key: 't1', kind: 'time', name: 'T1', of: (c, i) => c.qubits[i].t1Ns },
  { key: 'tphi', kind: 'time', name: 'white T_phi', of: (c, i) => c.qubits[i].tphiNs },
  { key: 'fluxNoise', kind: 'number', name: 'flux noise (Phi0/sqrt(Hz))', of: (c, i) => c.qubits[i].fluxNoisePhi0 },
  { key: 'readout', kind: 'frequency', name: 'readout resonator', of: (c, i) => c.qubits[i].readoutGHz },
];

/** Internal value -> SI. */
export function deviceToSi(kind: DeviceKind, v: number): number {
  return kind === 'frequency' ? v * 1e9 : kind === 'time' ? v * 1e-9 : v;
}
