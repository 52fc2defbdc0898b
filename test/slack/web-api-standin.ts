// A local stand-in for Slack's Web API: it speaks the wire format the real WebClient uses (POST /api/<method>,
// form-encoded with JSON strings inside, Bearer token), records every call, and serves the upload URL of
// files.uploadV2, response_url posts and the Socket Mode URL. Nothing in Bolt or the WebClient is mocked.
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';

export interface RecordedCall {
  method: string;
  /** Form fields, with JSON-looking ones (blocks, view) parsed. */
  params: Record<string, unknown>;
  token: string | undefined;
  at: number;
}

export interface ResponsePost {
  id: string;
  body: Record<string, unknown>;
  at: number;
}

export interface UserProfile {
  tz?: string;
}

export interface WebApiStandIn {
  /** Base for `clientOptions.slackApiUrl`, ending with `/api/`. */
  apiUrl: string;
  /** A response_url Slack would put in a payload; posts to it are recorded under `id`. */
  responseUrl(id: string): string;
  calls: RecordedCall[];
  responses: ResponsePost[];
  /** Bytes uploaded to files.uploadV2's upload URL, by file id. */
  uploads: Map<string, Buffer>;
  users: Map<string, UserProfile>;
  /** The next `count` calls of `method` (optionally only those whose params match) answer 429 + Retry-After. */
  rateLimit(
    method: string,
    retryAfterSeconds: number,
    count?: number,
    when?: (p: Record<string, unknown>) => boolean,
  ): void;
  /** The next `count` calls of `method` (optionally only matching ones) answer `{ ok: false, error }`. */
  failWith(
    method: string,
    error: string,
    count?: number,
    when?: (p: Record<string, unknown>) => boolean,
  ): void;
  /** Where apps.connections.open sends Socket Mode clients. */
  socketUrl?: string;
  callsOf(method: string): RecordedCall[];
  waitFor<T>(probe: () => T | undefined | false, timeoutMs?: number): Promise<T>;
  close(): Promise<void>;
}

interface FailureRule {
  method: string;
  error: string;
  left: number;
  when?: (p: Record<string, unknown>) => boolean;
}

interface RateLimitRule {
  method: string;
  retryAfter: number;
  left: number;
  when?: (p: Record<string, unknown>) => boolean;
}

async function readBody(req: IncomingMessage): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

function parseParams(raw: Buffer, contentType: string | undefined): Record<string, unknown> {
  const text = raw.toString('utf8');
  if (contentType?.includes('application/json'))
    return text ? (JSON.parse(text) as Record<string, unknown>) : {};
  const params: Record<string, unknown> = {};
  for (const [k, v] of new URLSearchParams(text)) {
    params[k] = /^[[{]/.test(v) ? JSON.parse(v) : v;
  }
  return params;
}

export async function startWebApiStandIn(): Promise<WebApiStandIn> {
  const calls: RecordedCall[] = [];
  const responses: ResponsePost[] = [];
  const uploads = new Map<string, Buffer>();
  const users = new Map<string, UserProfile>();
  const rules: RateLimitRule[] = [];
  const failures: FailureRule[] = [];
  let seq = 0;
  let base = '';
  const self: Partial<WebApiStandIn> = {};

  const answer = (method: string, p: Record<string, unknown>): Record<string, unknown> => {
    seq += 1;
    switch (method) {
      case 'auth.test':
        return {
          ok: true,
          url: 'https://kestrel.example/',
          team: 'Kestrel Valley',
          user: 'tankrunway',
          team_id: 'T0KESTREL',
          user_id: 'U0BOT',
          bot_id: 'B0BOT',
        };
      case 'chat.postMessage':
        return { ok: true, channel: p.channel, ts: `1700000000.${String(seq).padStart(6, '0')}` };
      case 'chat.postEphemeral':
        return { ok: true, message_ts: `1700000000.${String(seq).padStart(6, '0')}` };
      case 'users.info': {
        const id = String(p.user);
        const profile = users.get(id);
        if (!profile) return { ok: false, error: 'user_not_found' };
        return { ok: true, user: { id, name: id.toLowerCase(), tz: profile.tz } };
      }
      case 'views.open':
      case 'views.publish':
        return { ok: true, view: { id: `V${seq}`, ...(p.view as object) } };
      case 'files.getUploadURLExternal':
        return { ok: true, upload_url: `${base}/upload/F${seq}`, file_id: `F${seq}` };
      case 'files.completeUploadExternal':
        return { ok: true, files: (p.files as { id: string }[]).map((f) => ({ id: f.id, title: 'chart' })) };
      case 'apps.connections.open':
        return self.socketUrl
          ? { ok: true, url: self.socketUrl }
          : { ok: false, error: 'not_allowed_token_type' };
      default:
        return { ok: false, error: 'unknown_method' };
    }
  };

  const server: Server = createServer(async (req, res) => {
    const path = req.url ?? '/';
    const raw = await readBody(req);
    if (path.startsWith('/upload/')) {
      // The WebClient sends the bytes as multipart/form-data (one file part); keep the file itself.
      const form = await new Response(raw, { headers: { 'content-type': req.headers['content-type'] ?? '' } })
        .formData()
        .catch(() => undefined);
      const file = form ? [...form.values()].find((v) => v instanceof Blob) : undefined;
      uploads.set(
        path.slice('/upload/'.length),
        file instanceof Blob ? Buffer.from(await file.arrayBuffer()) : raw,
      );
      res.writeHead(200, { 'content-type': 'text/plain' }).end(`OK - ${raw.length}`);
      return;
    }
    if (path.startsWith('/response/')) {
      responses.push({
        id: path.slice('/response/'.length),
        body: JSON.parse(raw.toString('utf8')),
        at: Date.now(),
      });
      res.writeHead(200, { 'content-type': 'text/plain' }).end('ok');
      return;
    }
    const method = path.replace(/^\/api\//, '').split('?')[0] ?? '';
    const params = parseParams(raw, req.headers['content-type']);
    const token = req.headers.authorization?.replace(/^Bearer /, '') ?? (params.token as string | undefined);
    const rule = rules.find((r) => r.method === method && r.left > 0 && (!r.when || r.when(params)));
    calls.push({ method, params, token, at: Date.now() });
    if (rule) {
      rule.left -= 1;
      res.writeHead(429, { 'retry-after': String(rule.retryAfter), 'content-type': 'application/json' });
      res.end(JSON.stringify({ ok: false, error: 'ratelimited' }));
      return;
    }
    const failure = failures.find((f) => f.method === method && f.left > 0 && (!f.when || f.when(params)));
    if (failure) failure.left -= 1;
    const body = failure ? { ok: false, error: failure.error } : answer(method, params);
    res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(body));
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  Object.assign(self, {
    apiUrl: `${base}/api/`,
    responseUrl: (id: string) => `${base}/response/${id}`,
    calls,
    responses,
    uploads,
    users,
    rateLimit(method: string, retryAfter: number, count = 1, when?: (p: Record<string, unknown>) => boolean) {
      rules.push({ method, retryAfter, left: count, when });
    },
    failWith(method: string, error: string, count = 1, when?: (p: Record<string, unknown>) => boolean) {
      failures.push({ method, error, left: count, when });
    },
    callsOf: (method: string) => calls.filter((c) => c.method === method),
    async waitFor<T>(probe: () => T | undefined | false, timeoutMs = 5000): Promise<T> {
      const until = Date.now() + timeoutMs;
      for (;;) {
        const v = probe();
        if (v !== undefined && v !== false) return v;
        if (Date.now() > until) throw new Error('stand-in: timed out waiting for the expected calls');
        await new Promise((r) => setTimeout(r, 10));
      }
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  });
  return self as WebApiStandIn;
}
