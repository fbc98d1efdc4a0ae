/**
 * The human summary of a yield result (./summary.ts): the yield with its interval, the rules,
 * qubits and edges that fail most often, the yield against spread, the cycle error, and the
 * first failing samples; built from the JSON result itself so both say the same.
 */

const pct = (x: number, digits = 1) => `${(100 * x).toFixed(digits)} %`;

interface Row {
  samples: number;
  successes: number;
  fraction: number;
  low: number;
  high: number;
}

export function yieldText(r: Record<string, any>, top = 10): string {
  const y = r.yield as Row;
  const spread = r.spread as { rn: number; ec: number; g: number; measured: { rn: string[]; ec: string[] } };
  const lines: string[] = [];
  const plan = r.plan as { source: string; seed?: number; holds?: boolean; violations?: number; file?: string } | null;
  const how = r.mode === 'fixed'
    ? plan?.source === 'file'
      ? `fixed mode (plan ${plan.file} kept)`
      : `fixed mode (the planner's plan kept, seed ${plan?.seed}${plan?.holds ? '' : `; it breaks ${plan?.violations} rule condition(s) already`})`
    : `replan mode (each chip planned anew, planner seed ${r.planSeed})`;
  lines.push(`${r.chip} (${r.layout}): ${how}, ${y.samples} chips drawn with seed ${r.seed}`);
  const measured = [
    spread.measured.rn.length > 0 ? `R_n measured for ${spread.measured.rn.length} qubit(s)` : '',
    spread.measured.ec.length > 0 ? `E_C measured for ${spread.measured.ec.length} qubit(s)` : '',
  ].filter(Boolean).join(', ');
  lines.push(`  spread (1 sigma): junction R_n ${pct(spread.rn)}, shunt C ${pct(spread.ec)}, coupling C ${pct(spread.g)}${measured ? ` (${measured})` : ''}`);
  lines.push(`  yield ${pct(y.fraction)} (${y.successes} of ${y.samples}), 95 % interval ${pct(y.low)} to ${pct(y.high)} (Wilson)`);
  const failures = r.failures as { rules: { rule: string; samples: number; findings: number; fraction: number }[]; qubits: { qubit: string; samples: number; fraction: number }[]; edges: { edge: string; samples: number; fraction: number }[]; examples: { sample: number; reason: string | null }[] };
  if (failures.rules.length > 0) {
    lines.push('  rules broken most often (chips, findings):');
    for (const x of failures.rules.slice(0, top)) lines.push(`    ${x.rule.padEnd(22)} ${String(x.samples).padStart(7)} ${pct(x.fraction).padStart(8)}  ${x.findings}`);
    lines.push(`  qubits in broken rules most often: ${failures.qubits.slice(0, top).map((x) => `${x.qubit} ${x.samples}`).join(', ')}`);
    if (failures.edges.length > 0) lines.push(`  edges in broken rules most often: ${failures.edges.slice(0, top).map((x) => `${x.edge} ${x.samples}`).join(', ')}`);
  }
  const ce = r.cycleError as { samples: number; p05: number; median: number; p95: number; max: number } | null;
  if (ce) lines.push(`  error per cycle over ${ce.samples} plans: median ${ce.median.toExponential(2)}, 5-95 % ${ce.p05.toExponential(2)} to ${ce.p95.toExponential(2)}, max ${ce.max.toExponential(2)}`);
  const sweep = r.sweepSpread as (Row & { rn: number })[] | null;
  if (sweep) {
    lines.push('  yield against junction R_n spread (same draws, scaled):');
    lines.push(`    ${'R_n spread'.padEnd(11)} ${'yield'.padStart(8)}  95 % interval`);
    for (const s of sweep) lines.push(`    ${pct(s.rn, 2).padEnd(11)} ${pct(s.fraction).padStart(8)}  ${pct(s.low)} to ${pct(s.high)}`);
  }
  for (const ex of failures.examples.slice(0, 3)) lines.push(`  e.g. sample ${ex.sample}: ${ex.reason ?? ''} (fluxlane yield ... --sample ${ex.sample} lists all)`);
  lines.push('  (model estimates: verify on hardware)');
  return lines.join('\n');
}
