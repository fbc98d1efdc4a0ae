/**
 * Worker-thread entry of the design pool (src/gate/design-pool.ts): designs each request it is
 * sent with designCzGate and posts the design back (or the error's first line).
 */
import { parentPort } from 'node:worker_threads';
import { designCzGate } from './design.js';
import { requestFromWire, type WireRequest } from './design-wire.js';

if (!parentPort) throw new Error('design-worker: must run in a worker thread');
const port = parentPort;
port.on('message', (msg: { id: number; request: WireRequest }) => {
  try {
    port.postMessage({ id: msg.id, design: designCzGate(requestFromWire(msg.request)) });
  } catch (err) {
    port.postMessage({ id: msg.id, error: err instanceof Error ? err.message.split('\n')[0] : String(err) });
  }
});
