/**
 * Seconds spent per pipeline stage, for `--profile`. Stages nest by name only: timing the same
 * stage twice adds up. A disabled profiler costs one branch per call.
 */
export class StageProfiler {
  private readonly seconds = new Map<string, number>();
  constructor(readonly enabled = true) {}

  time<T>(stage: string, fn: () => T): T {
    if (!this.enabled) return fn();
    const t0 = process.hrtime.bigint();
    try {
      return fn();
    } finally {
      this.add(stage, Number(process.hrtime.bigint() - t0) * 1e-9);
    }
  }

  async timeAsync<T>(stage: string, fn: () => Promise<T>): Promise<T> {
    if (!this.enabled) return fn();
    const t0 = process.hrtime.bigint();
    try {
      return await fn();
    } finally {
      this.add(stage, Number(process.hrtime.bigint() - t0) * 1e-9);
    }
  }

  add(stage: string, seconds: number): void {
    this.seconds.set(stage, (this.seconds.get(stage) ?? 0) + seconds);
  }

  /** Stage name -> seconds, in the order stages were first seen. */
  report(): Record<string, number> {
    return Object.fromEntries(this.seconds);
  }
}

/** A profiler that records nothing (the default when `--profile` is not given). */
export const NO_PROFILE = new StageProfiler(false);
