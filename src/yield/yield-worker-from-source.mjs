// Worker entry when fluxlane runs from its TypeScript sources (tsx, vitest): registers tsx's
// loader in this worker thread, then runs the worker itself. The built package uses
// yield-worker.js directly (src/yield/pool.ts chooses).
import { register } from 'tsx/esm/api';

register();
await import('./yield-worker.ts');
