/**
 * The seam between the planner and the per-edge CZ pulse designer (the gate stage, src/gate/):
 *
 *     designCzGate(request: GateDesignRequest): GateDesign        (src/gate/design.ts)
 *
 * The planner calls it through `loadGateDesigner()`, which imports the gate stage lazily, so that
 * `fluxlane plan --no-pulses` and `fluxlane check` work without it and the planner's tests do not
 * pay for loading the simulator (the types come from src/gate/design.ts; a type-only import
 * costs nothing at run time). Units inside: GHz, ns, Phi0, rad.
 */
import type { GateDesign, GateDesignRequest, GateSpectatorRequest } from '../gate/design.js';

export type { GateDesign, GateDesignRequest, GateSpectatorRequest };

export type GateDesigner = (request: GateDesignRequest) => GateDesign;

/**
 * The gate stage's designer, or null when this build has no gate stage. Any other failure to
 * load it (a syntax error, a missing export) is thrown: that is a bug, not a missing feature.
 */
export async function loadGateDesigner(): Promise<GateDesigner | null> {
  let mod: Record<string, unknown>;
  try {
    // (a literal specifier, relative to this module: the command's bundle, src/cli/build-bundle.ts,
    // carries the gate stage as a chunk loaded here, not a second copy of its modules from dist/)
    mod = (await import('../gate/design.js')) as Record<string, unknown>;
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const message = err instanceof Error ? err.message : String(err);
    if (code === 'ERR_MODULE_NOT_FOUND' || /Cannot find module|Failed to load url|Does the file exist/i.test(message)) {
      if (message.includes('design')) return null;
    }
    throw err;
  }
  const fn = mod.designCzGate;
  if (typeof fn !== 'function') throw new Error('the gate stage (gate/design.js) does not export designCzGate');
  return fn as GateDesigner;
}
