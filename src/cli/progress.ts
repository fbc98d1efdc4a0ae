/**
 * A one-line progress bar on stderr for long work (simulating many edges, planning big chips).
 * Draws only when stderr is a terminal, at most every `intervalMs`, and erases itself on done(),
 * so piped and JSON output stay clean.
 *
 *   const bar = startProgress(ctx.io, 'simulating', edges.length);
 *   for (const e of edges) { ...; bar.tick(); }
 *   bar.done();
 */

import type { CliIo } from './io.js';

export interface Progress {
  /** `count` more done; `note` (optional) is shown after the bar, e.g. a running yield. */
  tick(count?: number, note?: string): void;
  done(): void;
}

export interface ProgressOptions {
  /** Width of the bar in characters. */
  width: number;
  /** Smallest time between two redraws. */
  intervalMs: number;
  /** Clock (injectable for tests). */
  now: () => number;
}

export const PROGRESS_DEFAULTS: Readonly<ProgressOptions> = Object.freeze({ width: 28, intervalMs: 100, now: () => Date.now() });

const SILENT: Progress = Object.freeze({ tick: () => undefined, done: () => undefined });

export function startProgress(io: CliIo, label: string, total: number, options: Partial<ProgressOptions> = {}): Progress {
  if (!io.stderrIsTTY || !(total > 0)) return SILENT;
  const { width, intervalMs, now } = { ...PROGRESS_DEFAULTS, ...options };
  const started = now();
  let done = 0;
  let lastDraw = -Infinity;
  let finished = false;
  let note = '';
  const draw = () => {
    const fraction = Math.min(1, done / total);
    const filled = Math.round(fraction * width);
    const seconds = ((now() - started) / 1000).toFixed(1);
    io.stderr(`\r${label} [${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${done}/${total} ${seconds} s${note}${note ? '\x1b[K' : ''}`);
  };
  return {
    tick(count = 1, text?: string) {
      if (finished) return;
      done += count;
      if (text !== undefined) note = text === '' ? '' : ` ${text}`;
      const t = now();
      if (t - lastDraw >= intervalMs || done >= total) {
        lastDraw = t;
        draw();
      }
    },
    done() {
      if (finished) return;
      finished = true;
      io.stderr('\r\x1b[K');
    },
  };
}
