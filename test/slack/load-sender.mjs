// Sends a burst of signed requests from its own thread, so the sender's work (signing, HTTP client) does not
// share the event loop of the app being measured. Plain JavaScript: worker threads load it without a compiler.
import { createHmac } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { parentPort, workerData } from 'node:worker_threads';

const { url, secret, bodies } = workerData;
const timestamp = Math.floor(Date.now() / 1000);
const results = await Promise.all(
  bodies.map(async (body) => {
    const signature = `v0=${createHmac('sha256', secret).update(`v0:${timestamp}:${body}`).digest('hex')}`;
    const sent = performance.now();
    const res = await fetch(url, {
      method: 'POST',
      headers: {
        'content-type': 'application/x-www-form-urlencoded',
        'x-slack-request-timestamp': String(timestamp),
        'x-slack-signature': signature,
      },
      body,
    });
    await res.arrayBuffer();
    return { ms: performance.now() - sent, status: res.status };
  }),
);
parentPort.postMessage(results);
