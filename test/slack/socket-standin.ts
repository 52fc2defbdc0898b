// A local Socket Mode endpoint: the websocket protocol Slack's Socket Mode speaks (a `hello` on connect,
// envelopes with an envelope_id pushed to the app, acks sent back by envelope_id, `disconnect` asking the
// client to reconnect). Used with the Web API stand-in, whose apps.connections.open points here.
import type { AddressInfo } from 'node:net';
import { type WebSocket, WebSocketServer } from 'ws';

export interface SocketStandIn {
  url: string;
  /** Connections opened so far (a reconnect adds one). */
  connections: number;
  acks: Map<string, Record<string, unknown>>;
  /** Sends an envelope to the newest open connection; resolves with its ack. */
  push(
    type: 'slash_commands' | 'events_api' | 'interactive',
    payload: object,
    retryAttempt?: number,
  ): Promise<Record<string, unknown>>;
  /** Asks the client to reconnect, as Slack does before it rotates a connection. */
  askToReconnect(): void;
  /** Drops every connection without warning. */
  dropAll(): void;
  waitForConnections(n: number, timeoutMs?: number): Promise<void>;
  close(): Promise<void>;
}

export async function startSocketStandIn(): Promise<SocketStandIn> {
  const wss = new WebSocketServer({ host: '127.0.0.1', port: 0 });
  await new Promise<void>((resolve) => wss.once('listening', () => resolve()));
  const open: WebSocket[] = [];
  const acks = new Map<string, Record<string, unknown>>();
  const waiters = new Map<string, (ack: Record<string, unknown>) => void>();
  let envelopes = 0;
  const state = { connections: 0 };

  wss.on('connection', (ws) => {
    state.connections += 1;
    open.push(ws);
    ws.on('message', (data) => {
      const msg = JSON.parse(String(data)) as Record<string, unknown>;
      const id = msg.envelope_id;
      if (typeof id === 'string') {
        acks.set(id, msg);
        waiters.get(id)?.(msg);
      }
    });
    ws.on('close', () => open.splice(open.indexOf(ws), 1));
    ws.send(
      JSON.stringify({
        type: 'hello',
        num_connections: 1,
        debug_info: { host: 'standin', approximate_connection_time: 3600 },
        connection_info: { app_id: 'A0TANK' },
      }),
    );
  });

  const url = `ws://127.0.0.1:${(wss.address() as AddressInfo).port}/link`;
  return {
    url,
    get connections() {
      return state.connections;
    },
    acks,
    push(type, payload, retryAttempt = 0) {
      envelopes += 1;
      const envelope_id = `env-${envelopes}`;
      const ws = open.at(-1);
      if (!ws) return Promise.reject(new Error('socket stand-in: no client connected'));
      const acked = new Promise<Record<string, unknown>>((resolve) => waiters.set(envelope_id, resolve));
      ws.send(
        JSON.stringify({
          envelope_id,
          type,
          payload,
          accepts_response_payload: type !== 'events_api',
          retry_attempt: retryAttempt,
          retry_reason: retryAttempt > 0 ? 'timeout' : '',
        }),
      );
      return acked;
    },
    askToReconnect() {
      for (const ws of open) ws.send(JSON.stringify({ type: 'disconnect', reason: 'refresh_requested' }));
    },
    dropAll() {
      for (const ws of [...open]) ws.terminate();
    },
    async waitForConnections(n, timeoutMs = 8000) {
      const until = Date.now() + timeoutMs;
      while (state.connections < n || open.length === 0) {
        if (Date.now() > until)
          throw new Error(`socket stand-in: ${state.connections} connections, wanted ${n}`);
        await new Promise((r) => setTimeout(r, 20));
      }
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const ws of open) ws.terminate();
        wss.close(() => resolve());
      }),
  };
}
