/**
 * A local stand-in for Discord's gateway websocket on an ephemeral port, speaking the real protocol in JSON
 * without compression: HELLO (op 10) on connect, IDENTIFY (op 2) -> READY dispatch, heartbeat (op 1) ->
 * ACK (op 11), RESUME (op 6) -> RESUMED; tests push dispatches such as INTERACTION_CREATE.
 */
import type { AddressInfo } from 'node:net';
import { type WebSocket, WebSocketServer } from 'ws';

export interface GatewayStandIn {
  url: string;
  /** IDENTIFY payloads received (token, intents, properties). */
  identifies: unknown[];
  heartbeats: number;
  /** RESUME payloads received after a dropped connection. */
  resumes: unknown[];
  /** Connections opened so far (a reconnect opens another). */
  connections: number;
  /** Drops every connection without a close frame, as a network failure does (close code 1006). */
  dropConnections(): void;
  /** Sends a dispatch (op 0) with the next sequence number to every connected client. */
  dispatch(type: string, data: unknown): void;
  /** Resolves once a client has identified and received READY. */
  ready: Promise<void>;
  close(): Promise<void>;
}

interface Frame {
  op: number;
  d?: unknown;
}

export async function startGatewayStandIn(options: { applicationId: string }): Promise<GatewayStandIn> {
  const server = new WebSocketServer({ port: 0, host: '127.0.0.1' });
  await new Promise<void>((resolve) => server.once('listening', () => resolve()));
  const { port } = server.address() as AddressInfo;
  const url = `ws://127.0.0.1:${port}`;
  const sockets = new Set<WebSocket>();
  let seq = 0;
  let markReady: () => void = () => {};
  const ready = new Promise<void>((resolve) => {
    markReady = resolve;
  });
  const state = { identifies: [] as unknown[], heartbeats: 0, resumes: [] as unknown[], connections: 0 };

  const send = (socket: WebSocket, frame: object) => socket.send(JSON.stringify(frame));

  server.on('connection', (socket) => {
    sockets.add(socket);
    state.connections++;
    socket.on('close', () => sockets.delete(socket));
    send(socket, { op: 10, d: { heartbeat_interval: 41_250 }, s: null, t: null });
    socket.on('message', (data) => {
      let frame: Frame;
      try {
        frame = JSON.parse(String(data)) as Frame;
      } catch {
        return;
      }
      if (frame.op === 1) {
        state.heartbeats++;
        send(socket, { op: 11, d: null, s: null, t: null });
      } else if (frame.op === 2) {
        state.identifies.push(frame.d);
        send(socket, {
          op: 0,
          t: 'READY',
          s: ++seq,
          d: {
            v: 10,
            user: {
              id: options.applicationId,
              username: 'tank-runway',
              discriminator: '0',
              avatar: null,
              bot: true,
              global_name: null,
            },
            guilds: [],
            session_id: 'stand-in-session',
            resume_gateway_url: url,
            application: { id: options.applicationId, flags: 0 },
            shard: [0, 1],
          },
        });
        markReady();
      } else if (frame.op === 6) {
        state.resumes.push(frame.d);
        send(socket, { op: 0, t: 'RESUMED', s: ++seq, d: null });
      }
    });
  });

  return {
    url,
    get identifies() {
      return state.identifies;
    },
    get heartbeats() {
      return state.heartbeats;
    },
    get resumes() {
      return state.resumes;
    },
    get connections() {
      return state.connections;
    },
    dropConnections() {
      for (const socket of sockets) socket.terminate();
    },
    ready,
    dispatch(type, data) {
      seq++;
      for (const socket of sockets) send(socket, { op: 0, t: type, s: seq, d: data });
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const socket of sockets) socket.terminate();
        server.close(() => resolve());
      }),
  };
}
