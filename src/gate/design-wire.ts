/**
 * A CZ design request as plain data, to cross a worker-thread boundary (src/gate/design-pool.ts):
 * the transmons travel as descriptors (Transmon.descriptor) and are rebuilt on the other side,
 * which gives the same numbers bit for bit (a transmon is its parameters).
 */
import { Transmon, type TransmonDescriptor } from '../transmon/transmon.js';
import type { GateDesignRequest, GateSpectatorRequest } from './design.js';

export interface WireSpectator extends Omit<GateSpectatorRequest, 'transmon'> {
  transmon: TransmonDescriptor;
}

export interface WireRequest extends Omit<GateDesignRequest, 'mover' | 'partner' | 'spectators' | 'budgetSpectators'> {
  mover: TransmonDescriptor;
  partner: TransmonDescriptor;
  spectators?: WireSpectator[];
  budgetSpectators?: WireSpectator[];
}

const toWire = (list: GateSpectatorRequest[]): WireSpectator[] => list.map((s) => ({ ...s, transmon: s.transmon.descriptor() }));
const fromWire = (list: WireSpectator[]): GateSpectatorRequest[] => list.map((s) => ({ ...s, transmon: Transmon.fromDescriptor(s.transmon) }));

export function requestToWire(req: GateDesignRequest): WireRequest {
  const { mover, partner, spectators, budgetSpectators, ...rest } = req;
  const w: WireRequest = { ...rest, rules: { ...req.rules }, mover: mover.descriptor(), partner: partner.descriptor() };
  if (spectators) w.spectators = toWire(spectators);
  if (budgetSpectators) w.budgetSpectators = toWire(budgetSpectators);
  return w;
}

export function requestFromWire(w: WireRequest): GateDesignRequest {
  const { mover, partner, spectators, budgetSpectators, ...rest } = w;
  const req: GateDesignRequest = { ...rest, mover: Transmon.fromDescriptor(mover), partner: Transmon.fromDescriptor(partner) };
  if (spectators) req.spectators = fromWire(spectators);
  if (budgetSpectators) req.budgetSpectators = fromWire(budgetSpectators);
  return req;
}
