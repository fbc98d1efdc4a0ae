/** wrapLine (src/util/wrap.ts): lines at most the width (a longer word stays whole), the words unchanged, continuation lines indented. */
import { describe, expect, it } from 'vitest';
import { wrapLine } from '../../src/util/wrap.js';

describe('wrapLine', () => {
  const long = 'cannot plan CZ: Q0-Q1: no option clears every rule; kept Q0 11-02 with the fewest problems (3 problem(s): cz-swept-01-01 Q7; cz-swept-11-20 Q7; cz-swept-11-02 Q7)';

  it('keeps a short line as it is', () => {
    expect(wrapLine('violation [01-01] Q1, Q2: 12.0 MHz apart')).toBe('violation [01-01] Q1, Q2: 12.0 MHz apart');
  });

  it('breaks at spaces within the width, indents the continuation and keeps every word', () => {
    const out = wrapLine(`  ${long}`, '      ', 60).split('\n');
    expect(out.length).toBeGreaterThan(2);
    for (const l of out) expect(l.length).toBeLessThanOrEqual(60);
    for (const l of out.slice(1)) expect(l.startsWith('      ')).toBe(true);
    expect(out.join(' ').split(/\s+/).filter(Boolean)).toEqual(long.split(' '));
  });

  it('a word longer than the width stays whole on its own line', () => {
    const out = wrapLine(`short ${'x'.repeat(30)} end`, '  ', 20).split('\n');
    expect(out).toEqual(['short', `  ${'x'.repeat(30)}`, '  end']);
  });
});
