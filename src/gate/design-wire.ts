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

export interface WireRequest extends Omit<GateDesignRequest, 'mover' | 'partner' | 'spectators'> {
  mover: TransmonDescriptor;
  partner: TransmonDescriptor;
  spectators?: WireSpectator[];
}

export function requestToWire(req: GateDesignRequest): WireRequest {
  const { mover, partner, spectators, ...rest } = req;
  const w: WireRequest = { ...rest, rules: { ...req.rules }, mover: mover.descriptor(), partner: partner.descriptor() };
  if (spectators) w.spectators = spectators.map((s) => ({ ...s, transmon: s.transmon.descriptor() }));
  return w;
}

export function requestFromWire(w: WireRequest): GateDesignRequest {
  const { mover, partner, spectators, ...rest } = w;
  const req: GateDesignRequest = { ...rest, mover: Transmon.fromDescriptor(mover), partner: Transmon.fromDescriptor(partner) };
  if (spectators) req.spectators = spectators.map((s) => ({ ...s, transmon: Transmon.fromDescriptor(s.transmon) }));
  return req;
}
