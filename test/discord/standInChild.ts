/**
 * The Discord stand-ins in a process of their own, for load measurements: in the test's process their socket
 * writes and request parsing would queue behind the bot's work and count against the adapter. Speaks JSON lines:
 * prints {ready, gatewayUrl, apiUrl} once, then {call} for every interaction callback; reads {dispatch} lines.
 */
import { createInterface } from 'node:readline';
import { startGatewayStandIn } from './gatewayStandIn.js';
import { startRestStandIn } from './restStandIn.js';

const applicationId = process.argv[2] ?? '700000000000000001';
const gateway = await startGatewayStandIn({ applicationId });
const rest = await startRestStandIn({ gatewayUrl: gateway.url, applicationId });
const out = (message: object) => process.stdout.write(`${JSON.stringify(message)}\n`);

let reported = 0;
setInterval(() => {
  for (; reported < rest.calls.length; reported++) {
    const c = rest.calls[reported];
    if (c)
      out({
        call: {
          method: c.method,
          path: c.path,
          at: c.at,
          limited: c.limited,
          type: (c.body as { type?: number } | undefined)?.type,
        },
      });
  }
}, 10).unref();

out({ ready: true, gatewayUrl: gateway.url, apiUrl: rest.apiUrl });
for await (const line of createInterface({ input: process.stdin })) {
  try {
    const message = JSON.parse(line) as { dispatch?: { type: string; data: unknown } };
    if (message.dispatch) gateway.dispatch(message.dispatch.type, message.dispatch.data);
  } catch {
    // a malformed line from the parent is ignored
  }
}
await gateway.close();
await rest.close();
