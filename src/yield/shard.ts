/**
 * Slices of a yield run for a cluster: shard K of N (K = 0 .. N-1, as Slurm numbers the tasks of
 * a job array `sbatch --array=0-(N-1)`) runs samples [floor(K S / N), floor((K + 1) S / N)) of
 * S samples. Each sample's chip depends on (seed, sample index) only (src/yield/draw.ts), so the
 * slices together are exactly the whole run, whatever N; `fluxlane yield-merge` joins them
 * (./part.ts).
 *
 * Without --shard, a Slurm array task takes its shard from the environment: K =
 * SLURM_ARRAY_TASK_ID - SLURM_ARRAY_TASK_MIN (0 when MIN is unset), N = SLURM_ARRAY_TASK_COUNT.
 */
import { InputError } from '../util/errors.js';

export interface Shard {
  index: number;
  count: number;
}

export const MAX_SHARDS = 100_000;

/** "K/N" from --shard. */
export function parseShard(text: string, flag = '--shard'): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!(count >= 1 && count <= MAX_SHARDS && index >= 0 && index < count)) {
    throw new InputError({ message: `option ${flag}: expected K/N with 0 <= K < N <= ${MAX_SHARDS} (e.g. 0/8, as Slurm numbers array tasks), found ${JSON.stringify(text)}` });
  }
  return { index, count };
}

/** The shard of a Slurm array task, or null outside one. */
export function shardFromEnvironment(env: Record<string, string | undefined>): Shard | null {
  const id = env.SLURM_ARRAY_TASK_ID;
  if (id === undefined || id === '') return null;
  const count = env.SLURM_ARRAY_TASK_COUNT;
  const min = env.SLURM_ARRAY_TASK_MIN ?? '0';
  const integer = (s: string | undefined) => (s !== undefined && /^\d+$/.test(s.trim()) ? Number(s) : NaN);
  const k = integer(id) - integer(min);
  const n = integer(count);
  if (!(n >= 1 && n <= MAX_SHARDS && k >= 0 && k < n)) {
    throw new InputError({
      message: `environment SLURM_ARRAY_TASK_ID=${id}, SLURM_ARRAY_TASK_MIN=${env.SLURM_ARRAY_TASK_MIN ?? '(unset)'}, SLURM_ARRAY_TASK_COUNT=${count ?? '(unset)'}: expected one shard per task of an array 0-(N-1) (sbatch --array=0-7 for 8 shards), or give --shard K/N`,
    });
  }
  return { index: k, count: n };
}

/** Samples [from, to) of a shard. */
export function shardRange(samples: number, shard: Shard): { from: number; to: number } {
  return { from: Math.floor((shard.index * samples) / shard.count), to: Math.floor(((shard.index + 1) * samples) / shard.count) };
}
