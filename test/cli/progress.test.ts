import { describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/io.js';
import { startProgress } from '../../src/cli/progress.js';

describe('startProgress', () => {
  it('draws nothing when stderr is not a terminal', () => {
    const io = memoryIo({ stderrIsTTY: false });
    const bar = startProgress(io, 'work', 10);
    for (let i = 0; i < 10; i++) bar.tick();
    bar.done();
    expect(io.err).toBe('');
  });

  it('on a terminal draws a bar at most every intervalMs, always the last step, and erases itself', () => {
    const io = memoryIo({ stderrIsTTY: true });
    let t = 0;
    const bar = startProgress(io, 'work', 4, { width: 4, intervalMs: 100, now: () => t });
    bar.tick(); // t = 0: first draw
    t = 50;
    bar.tick(); // too soon: skipped
    t = 150;
    bar.tick(); // drawn
    t = 160;
    bar.tick(); // last step: drawn
    bar.done();
    expect(io.err).toBe('\rwork [#...] 1/4 0.0 s\rwork [###.] 3/4 0.1 s\rwork [####] 4/4 0.2 s\r\x1b[K');
  });

  it('a note given with tick is shown after the bar until another replaces it (the line is cleared after it)', () => {
    const io = memoryIo({ stderrIsTTY: true });
    let t = 0;
    const bar = startProgress(io, 'yield', 2, { width: 2, intervalMs: 0, now: () => t });
    bar.tick(1, 'yield 100.0 %');
    t = 1000;
    bar.tick(1, 'yield 50.0 %');
    bar.done();
    expect(io.err).toBe('\ryield [#.] 1/2 0.0 s yield 100.0 %\x1b[K\ryield [##] 2/2 1.0 s yield 50.0 %\x1b[K\r\x1b[K');
  });
});
