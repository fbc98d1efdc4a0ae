/**
 * Same seed, same bytes: a yield run gives the same result file for any thread count, and its
 * slices (--shard K/N, or a Slurm array task's environment) joined by yield-merge give exactly the
 * bytes of the single run. The merge refuses parts of other runs, repeated and missing shards,
 * and files that are not parts. (The cluster itself is exercised by .ci/slurm-yield.sh.)
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runFluxlane } from '../support/cli.js';
import { shardRange } from '../../src/yield/shard.js';

const demo = join(process.cwd(), 'layouts/bowline-5.yaml');
const base = ['yield', demo, '--samples', '48', '--seed', '3', '--spread-rn', '3%', '--sweep-spread', '1%,3%,6%'];

describe('yield: threads and shards give the same bytes', () => {
  const dir = mkdtempSync(join(tmpdir(), 'fluxlane-shards-'));
  const read = (f: string) => readFileSync(join(dir, f), 'utf8');

  it('1 and 3 worker threads write the same result; three shards merged give it too', async () => {
    for (const t of ['1', '3']) {
      const r = await runFluxlane([...base, '--threads', t, '-o', `t${t}.json`], { cwd: dir });
      expect(r.code, r.err).toBe(0);
      // the threads really ran (a job that cannot be sent to a worker falls back to one thread)
      expect(r.err).not.toMatch(/worker threads could not run/);
    }
    expect(read('t3.json')).toBe(read('t1.json'));
    for (const k of [2, 0, 1]) {
      const r = await runFluxlane([...base, '--threads', '1', '--shard', `${k}/3`, '-o', `part-${k}.json`], { cwd: dir });
      expect(r.code, r.err).toBe(0);
      expect(r.out).toMatch(new RegExp(`^yield part ${k}/3 of Bowline-5: samples `));
    }
    const m = await runFluxlane(['yield-merge', 'part-1.json', 'part-0.json', 'part-2.json', '-o', 'merged.json'], { cwd: dir });
    expect(m.code, m.err).toBe(0);
    expect(read('merged.json')).toBe(read('t1.json'));
    const result = JSON.parse(read('t1.json'));
    expect(result).toMatchObject({ format: 'fluxlane-yield', version: 1, chip: 'Bowline-5', mode: 'fixed', seed: 3, samples: 48 });
    expect(result.sweepSpread.map((s: { rn: number }) => s.rn)).toEqual([0.01, 0.03, 0.06]);
  }, 60_000);

  it('a Slurm array task (SLURM_ARRAY_TASK_ID, _COUNT, _MIN) runs the same slice as --shard', async () => {
    const env = { SLURM_ARRAY_TASK_ID: '6', SLURM_ARRAY_TASK_MIN: '5', SLURM_ARRAY_TASK_COUNT: '3' };
    const r = await runFluxlane([...base, '--threads', '1', '-o', 'env-1.json'], { cwd: dir, env });
    expect(r.code, r.err).toBe(0);
    expect(read('env-1.json')).toBe(read('part-1.json'));
    const bad = await runFluxlane([...base, '--threads', '1', '-o', 'x.json'], { cwd: dir, env: { SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_COUNT: '3' } });
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^environment SLURM_ARRAY_TASK_ID=3, SLURM_ARRAY_TASK_MIN=\(unset\), SLURM_ARRAY_TASK_COUNT=3: expected one shard per task/);
  });

  it('the merge refuses other runs, repeated and missing shards, and files that are not parts', async () => {
    const other = await runFluxlane([...base.map((a) => (a === '3' ? '4' : a)), '--threads', '1', '--shard', '2/3', '-o', 'other-2.json'], { cwd: dir });
    expect(other.code, other.err).toBe(0);
    const cases: [string[], RegExp][] = [
      [['part-0.json', 'part-1.json', 'other-2.json'], /^other-2\.json: expected a part of the same run as part-0\.json, found another seed: 4 here, 3 there\n$/],
      [['part-0.json', 'part-1.json'], /^expected all 3 shards 0-2, found shard\(s\) 2 missing\n$/],
      [['part-0.json', 'part-1.json', 'part-2.json', 'part-1.json'], /^part-1\.json: expected each shard once, found shard 1\/3 again \(also in part-1\.json\)\n$/],
      [['part-0.json', 't1.json'], /^t1\.json: expected a yield part .*found a whole yield result/],
      [['part-0.json', 'nothing.json'], /^nothing\.json: expected a readable yield part, found no such file\n$/],
    ];
    for (const [files, message] of cases) {
      const r = await runFluxlane(['yield-merge', ...files, '-o', 'bad.json'], { cwd: dir });
      expect(r.code, files.join(' ')).toBe(2);
      expect(r.err).toMatch(message);
      expect(r.out).toBe('');
    }
    expect(() => readFileSync(join(dir, 'bad.json'))).toThrow();
  });

  it('shards split the samples into contiguous slices, every sample exactly once', () => {
    for (const [s, n] of [[10, 3], [7, 7], [5, 8], [10_000, 64]]) {
      const slices = Array.from({ length: n }, (_, k) => shardRange(s, { index: k, count: n }));
      expect(slices[0].from).toBe(0);
      expect(slices[n - 1].to).toBe(s);
      slices.slice(1).forEach((x, k) => expect(x.from).toBe(slices[k].to));
    }
  });
});
