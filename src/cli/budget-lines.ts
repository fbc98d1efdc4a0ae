/**
 * The error budget of one designed gate as text lines (fluxlane gate --noise, fluxlane simulate
 * --noise): each term an average gate infidelity (README physics conventions sec. 4), their sum
 * the predicted error.
 */
import type { SpectatorBudget, WaveformNoiseBudget } from '../budget/waveform-budget.js';

/** The error budget as text: each term an average gate infidelity, their sum the predicted error. */
export function budgetLines(nb: Pick<WaveformNoiseBudget, 'coherent' | 't1' | 'whiteDephasing' | 'fluxNoise' | 'fluxNoiseSplit'>, sb: Pick<SpectatorBudget, 'spectators' | 'spectatorLeakage' | 'spectatorShares'> | null, moverId: string, partnerId: string): string[] {
  const e = (x: number) => x.toExponential(2);
  const total = nb.coherent + nb.t1 + nb.whiteDephasing + nb.fluxNoise + (sb?.spectators ?? 0);
  const out = [
    'error budget (average gate infidelities; model estimates)',
    `  coherent         ${e(nb.coherent)}   (leakage and phase errors of the waveform)`,
    `  T1               ${e(nb.t1)}`,
    `  white dephasing  ${e(nb.whiteDephasing)}`,
    `  flux noise       ${e(nb.fluxNoise)}   (quasi-static 1/f: ${moverId} ${e(nb.fluxNoiseSplit.mover)} at sigma ${e(nb.fluxNoiseSplit.moverSigma)} Phi0, ${partnerId} ${e(nb.fluxNoiseSplit.partner)} at sigma ${e(nb.fluxNoiseSplit.partnerSigma)} Phi0)`,
  ];
  if (sb) out.push(`  spectators       ${e(sb.spectators)}   (${sb.spectatorShares.length === 0 ? 'no other neighbour of the mover' : `${sb.spectatorShares.map((x) => `${x.qubit} ${e(x.error)}${x.reduced === 'none' ? '' : x.reduced === 'estimate' ? ' (admixture estimate)' : x.reduced === 'moving-basis' ? ' (moving basis)' : ' (reduced model)'}`).join(', ')}; added leakage ${e(sb.spectatorLeakage)}`})`);
  out.push(`  total            ${e(total)}${sb ? '' : '   (spectators not counted: pass --plan to count the plan\'s spectators where it puts them)'}`);
  return out;
}

