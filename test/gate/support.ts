/** The Bowline-5 demo edge Q1-Q0 (mover Q1 parked at its sweet spot, Q0 at its sweet spot). */
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';
import { chargeCouplingFromExchange } from '../../src/pair/coupling.js';
import type { EdgeContext } from '../../src/gate/context.js';
import { TwoLevelTable } from '../../src/gate/two-level-table.js';
import { pairResonances } from '../../src/pair/resonances.js';

export const LAYOUT_PATH = 'layouts/bowline-5.yaml';
export const layout = loadLayoutFile(LAYOUT_PATH, LAYOUT_PATH);
export const qubit = (id: string): Transmon => Transmon.fromLayout(layout.qubits.find((q) => q.id === id)!);
export const Q1 = qubit('Q1');
export const Q0 = qubit('Q0');
export const G_LAYOUT = layout.couplings.find((c) => [c.a, c.b].sort().join() === 'Q0,Q1')!.gGHz;
export const G_CHARGE = chargeCouplingFromExchange(G_LAYOUT, Q1.chargeElement01(0), Q0.chargeElement01(0));
export const CTX: EdgeContext = { mover: Q1, partner: Q0, partnerFlux: 0, gChargeGHz: G_CHARGE, crossing: '11-20', moverParkFlux: 0 };
export const BARE_CROSSING = pairResonances(Q1, Q0, 0, G_CHARGE)['11-20']!.moverFlux;
export const TABLE = new TwoLevelTable(CTX, 0, Math.min(0.5, BARE_CROSSING * 1.3));
