/** A demo layout with lookups of its transmons and couplings by qubit name (tests of the physics on demo parameters). */
import { loadLayoutFile } from '../../src/layout/load.js';
import { Transmon } from '../../src/transmon/transmon.js';

export function demoLayout(name: string) {
  const layout = loadLayoutFile(`layouts/${name}.yaml`, `layouts/${name}.yaml`);
  /** The transmon of qubit `id`. */
  const q = (id: string) => Transmon.fromLayout(layout.qubits.find((x) => x.id === id)!);
  /** g (GHz) of the coupling between qubits a and b. */
  const g = (a: string, b: string) => layout.couplings.find((c) => [c.a, c.b].sort().join() === [a, b].sort().join())!.gGHz;
  return { layout, q, g };
}
