// Worker entry when fluxlane runs from its TypeScript sources (tsx, vitest): registers tsx's
// loader in this worker thread, then runs the worker itself. The built package uses
// design-worker.js directly (src/gate/design-pool.ts chooses).
import { register } from 'tsx/esm/api';

register();
await import('./design-worker.ts');
