/**
 * A local stand-in for Discord's REST API (v10) on an ephemeral port: it answers the routes the adapter
 * uses with the shapes discord.js expects, records every call (JSON and multipart bodies decoded), and can
 * answer a route with 429 once to exercise the client's rate-limit handling.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { snowflake } from './snowflake.js';

export interface RecordedFile {
  field: string;
  name: string;
  type: string;
  bytes: Buffer;
}

export interface RecordedCall {
  method: string;
  /** Decoded path below /api/v10, e.g. "/webhooks/1/tok/messages/@original". */
  path: string;
  query: URLSearchParams;
  /** The JSON body, or the decoded payload_json of a multipart body. */
  body: unknown;
  files: RecordedFile[];
  /** Answered with 429 (the client should retry). */
  limited: boolean;
  at: number;
}

export interface RestStandIn {
  apiUrl: string;
  calls: RecordedCall[];
  /** The next `times` calls whose "METHOD path" matches get 429 with Retry-After `seconds`. */
  rateLimit(pattern: RegExp, seconds: number, times?: number): void;
  /** Resolves with the first call (made so far or later) matching the predicate. */
  waitFor(match: (call: RecordedCall) => boolean, timeoutMs?: number): Promise<RecordedCall>;
  close(): Promise<void>;
}

async function readBody(req: IncomingMessage): Promise<{ body: unknown; files: RecordedFile[] }> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  const raw = Buffer.concat(chunks);
  const type = req.headers['content-type'] ?? '';
  if (raw.length === 0) return { body: undefined, files: [] };
  if (type.startsWith('multipart/form-data')) {
    // The platform's fetch parses multipart exactly as a browser would; the stand-in needs no parser of its own.
    const form = await new Response(raw, { headers: { 'content-type': type } }).formData();
    const files: RecordedFile[] = [];
    let body: unknown;
    for (const [field, value] of form.entries()) {
      if (typeof value === 'string') {
        if (field === 'payload_json') body = JSON.parse(value);
      } else {
        files.push({
          field,
          name: value.name,
          type: value.type,
          bytes: Buffer.from(await value.arrayBuffer()),
        });
      }
    }
    return { body, files };
  }
  return { body: type.includes('json') ? JSON.parse(raw.toString('utf8')) : raw.toString('utf8'), files: [] };
}

export async function startRestStandIn(options: {
  gatewayUrl: string;
  applicationId: string;
}): Promise<RestStandIn> {
  const calls: RecordedCall[] = [];
  const limits: { pattern: RegExp; seconds: number; left: number }[] = [];
  const waiters: { match: (c: RecordedCall) => boolean; resolve: (c: RecordedCall) => void }[] = [];
  /** Channel posts already made, by channel and nonce (Discord returns the first one for an enforced nonce). */
  const byNonce = new Map<string, object>();

  const message = (channelId: string, body: unknown) => {
    const b = (body ?? {}) as { content?: string; embeds?: unknown[]; flags?: number };
    return {
      id: snowflake(Date.now()),
      channel_id: channelId,
      type: 0,
      content: b.content ?? '',
      author: {
        id: options.applicationId,
        username: 'tank-runway',
        discriminator: '0',
        avatar: null,
        bot: true,
        global_name: null,
      },
      embeds: b.embeds ?? [],
      attachments: [],
      mentions: [],
      mention_roles: [],
      pinned: false,
      tts: false,
      mention_everyone: false,
      timestamp: new Date().toISOString(),
      edited_timestamp: null,
      flags: b.flags ?? 0,
      components: [],
    };
  };

  function route(call: RecordedCall): { status: number; json?: unknown } {
    const { method, path, body } = call;
    if (method === 'GET' && path === '/gateway/bot') {
      return {
        status: 200,
        json: {
          url: options.gatewayUrl,
          shards: 1,
          session_start_limit: { total: 1000, remaining: 999, reset_after: 14_400_000, max_concurrency: 1 },
        },
      };
    }
    if (method === 'PUT' && /^\/applications\/\d+(\/guilds\/\d+)?\/commands$/.test(path)) {
      const commands = Array.isArray(body) ? body : [];
      return {
        status: 200,
        json: commands.map((c: object) => ({
          ...c,
          id: snowflake(Date.now()),
          application_id: options.applicationId,
          version: '1',
        })),
      };
    }
    if (method === 'POST' && /^\/interactions\/\d+\/[^/]+\/callback$/.test(path)) {
      return { status: 204 };
    }
    const webhook = /^\/webhooks\/\d+\/[^/]+(\/messages\/@original)?$/.exec(path);
    if (webhook?.[1] && method === 'DELETE') return { status: 204 };
    if (webhook && (method === 'PATCH' || method === 'POST'))
      return { status: 200, json: message('0', body) };
    const channel = /^\/channels\/(\d+)\/messages$/.exec(path);
    if (channel && method === 'POST') {
      const b = (body ?? {}) as { nonce?: string; enforce_nonce?: boolean };
      const key = `${channel[1]}|${b.nonce}`;
      if (b.enforce_nonce && b.nonce && byNonce.has(key)) return { status: 200, json: byNonce.get(key) };
      const posted = message(channel[1] ?? '0', body);
      if (b.enforce_nonce && b.nonce) byNonce.set(key, posted);
      return { status: 200, json: posted };
    }
    return { status: 404, json: { message: 'Unknown route', code: 0 } };
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://stand-in');
    const path = decodeURIComponent(url.pathname.replace(/^\/api\/v10/, ''));
    const { body, files } = await readBody(req);
    const call: RecordedCall = {
      method: req.method ?? 'GET',
      path,
      query: url.searchParams,
      body,
      files,
      limited: false,
      at: Date.now(),
    };
    const limit = limits.find((l) => l.left > 0 && l.pattern.test(`${call.method} ${path}`));
    if (limit) {
      limit.left--;
      call.limited = true;
      calls.push(call);
      res.writeHead(429, {
        'content-type': 'application/json',
        'retry-after': String(limit.seconds),
        'x-ratelimit-limit': '5',
        'x-ratelimit-remaining': '0',
        'x-ratelimit-reset-after': String(limit.seconds),
        'x-ratelimit-bucket': `bucket-${path}`,
        'x-ratelimit-scope': 'user',
      });
      res.end(
        JSON.stringify({ message: 'You are being rate limited.', retry_after: limit.seconds, global: false }),
      );
      return;
    }
    calls.push(call);
    for (const w of waiters.filter((x) => x.match(call))) {
      waiters.splice(waiters.indexOf(w), 1);
      w.resolve(call);
    }
    const answer = route(call);
    if (answer.json === undefined) {
      res.writeHead(answer.status);
      res.end();
    } else {
      res.writeHead(answer.status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(answer.json));
    }
  }

  const server: Server = createServer((req, res) => {
    handle(req, res).catch((error: unknown) => {
      res.writeHead(500, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ message: String(error), code: 0 }));
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;

  return {
    apiUrl: `http://127.0.0.1:${port}/api`,
    calls,
    rateLimit(pattern, seconds, times = 1) {
      limits.push({ pattern, seconds, left: times });
    },
    waitFor(match, timeoutMs = 10_000) {
      const done = calls.find((c) => !c.limited && match(c));
      if (done) return Promise.resolve(done);
      return new Promise((resolve, reject) => {
        const timer = setTimeout(
          () => reject(new Error(`no matching REST call within ${timeoutMs} ms`)),
          timeoutMs,
        );
        waiters.push({
          match,
          resolve: (c) => {
            clearTimeout(timer);
            resolve(c);
          },
        });
      });
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
