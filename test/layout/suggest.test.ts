import { describe, expect, it } from 'vitest';
import { didYouMean, editDistance } from '../../src/layout/suggest.js';

describe('editDistance (optimal string alignment)', () => {
  it.each([
    ['kitten', 'sitting', 3], // the classic Levenshtein example (from memory; 2 substitutions + 1 insertion)
    ['', 'abc', 3],
    ['abc', 'abc', 0],
    ['ab', 'ba', 1], // one transposition
    ['ca', 'abc', 3], // OSA (restricted) distance; unrestricted Damerau-Levenshtein would give 2
    ['flaw', 'lawn', 2],
  ])('editDistance(%s, %s) = %d', (a, b, d) => {
    expect(editDistance(a, b)).toBe(d);
    expect(editDistance(b, a)).toBe(d);
  });
});

describe('didYouMean', () => {
  const keys = ['pos', 'ec', 'ejMax', 'asymmetry', 'fMax', 'anharmonicity', 'fMin', 'rn', 't1', 'tphi', 'fluxNoise'];
  it.each([
    ['ejmax', 'ejMax'], ['EC', 'ec'], ['f_max', 'fMax'], ['asymetry', 'asymmetry'], ['anharmonicty', 'anharmonicity'],
    ['flux_noise', 'fluxNoise'], ['T1', 't1'], ['Tphi', 'tphi'],
  ])('didYouMean(%s) = %s', (word, hint) => {
    expect(didYouMean(word, keys)).toBe(hint);
  });
  it('offers nothing for words far from every candidate', () => {
    expect(didYouMean('frequency', keys)).toBeUndefined();
    expect(didYouMean('colour', keys)).toBeUndefined();
  });
});
