// `tankrunway serve` as a person runs it: the real bin/tankrunway.js (compiled dist/) in a child process, with
// its settings in the environment and Slack played by the local stand-ins.
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { openStore } from '../../bot/store/index.js';
import { startGatewayStandIn } from '../../test/discord/gatewayStandIn.js';
import { startRestStandIn } from '../../test/discord/restStandIn.js';
import { commandFields, signingSecret } from '../../test/slack/harness.js';
import { postSigned, slashCommandBody } from '../../test/slack/signed-request.js';
import { startSocketStandIn } from '../../test/slack/socket-standin.js';
import { startWebApiStandIn, type WebApiStandIn } from '../../test/slack/web-api-standin.js';

const root = fileURLToPath(new URL('../..', import.meta.url));
const bin = join(root, 'bin/tankrunway.js');
// Only what serve needs: the test's own settings must not leak in from the machine.
const baseEnv = { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '' };

function serveOnce(args: string[], env: Record<string, string>) {
  return spawnSync(process.execPath, [bin, 'serve', ...args], {
    env: { ...baseEnv, ...env },
    encoding: 'utf8',
    timeout: 20_000,
  });
}

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tankrunway-serve-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('tankrunway serve: settings', () => {
  it.each([
    [{ SLACK_BOT_TOKEN: 'xoxb-1' }, 'SLACK_SIGNING_SECRET is missing'],
    [{ SLACK_BOT_TOKEN: 'xoxp-1', SLACK_SIGNING_SECRET: signingSecret }, 'SLACK_BOT_TOKEN must'],
    [{ PORT: 'eighty' }, 'PORT must'],
    [{ DISCORD_TOKEN: 'abc' }, 'DISCORD_APPLICATION_ID is missing'],
  ])('stops start-up with one line and exit code 2 for %o', (env, message) => {
    const run = serveOnce(['--db', join(dir, 'bad.sqlite')], env);
    expect(run.status).toBe(2);
    expect(run.stderr.startsWith(`tankrunway serve: ${message}`)).toBe(true);
    expect(run.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('prints the Slack manifest for the configured command', () => {
    const run = serveOnce(['--slack-manifest', '--public-url', 'https://bot.kestrel.example'], {
      TANKRUNWAY_COMMAND: '/kvtanks',
    });
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('command: "/kvtanks"');
    expect(run.stdout).toContain('request_url: "https://bot.kestrel.example/slack/events"');
  });
});

describe('tankrunway serve: Slack over HTTP', () => {
  let api: WebApiStandIn;
  let child: ChildProcess;
  let stderr = '';
  let eventsUrl = '';
  // The bot's clock starts two seconds before the team's 07:00 digest (team zone UTC), set up beforehand.
  const start = Date.parse('2026-12-01T06:59:58Z');
  beforeAll(async () => {
    const db = join(dir, 'serve.sqlite');
    const store = openStore(db);
    const bot = createBot({ store });
    for (const [text, at] of [
      [
        'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product=water site="North Yard"',
        20,
      ],
      ['T4 62in', 20],
      ['T4 60in', 2],
      ['set digest 07:00 here', 1],
    ] as const) {
      const replies = await bot.handle({
        team: 'slack:T0SERVE',
        channel: 'C0OPS',
        user: 'U0ANA',
        text,
        receivedAt: start - at * 3_600_000,
      });
      expect(replies[0]?.kind).toBe('confirmation');
    }
    store.close();
    api = await startWebApiStandIn();
    child = spawn(
      process.execPath,
      [bin, 'serve', '--db', db, '--tick-seconds', '0.2', '--now', new Date(start).toISOString()],
      {
        env: {
          ...baseEnv,
          SLACK_BOT_TOKEN: 'xoxb-serve',
          SLACK_SIGNING_SECRET: signingSecret,
          SLACK_API_URL: api.apiUrl,
          PORT: '0',
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      },
    );
    child.stderr?.on('data', (d: Buffer) => {
      stderr += d.toString('utf8');
    });
    const port = await api.waitFor(() => /listening on port (\d+)/.exec(stderr)?.[1], 20_000);
    eventsUrl = `http://127.0.0.1:${port}/slack/events`;
  });
  afterAll(async () => {
    if (child.exitCode === null) child.kill('SIGKILL');
    await api.close();
  });

  let n = 0;
  async function say(text: string) {
    n += 1;
    const c = { team: 'T0SERVE', channel: 'C0OPS', user: 'U0ANA', text, id: `serve-${n}` };
    const res = await postSigned(
      eventsUrl,
      slashCommandBody(commandFields(c, api.responseUrl(c.id))),
      'application/x-www-form-urlencoded',
      {
        secret: signingSecret,
      },
    );
    expect(res.status).toBe(200);
    return api.waitFor(() => api.responses.find((r) => r.id === c.id));
  }

  it('answers slash commands and posts the digest when it falls due, then stops cleanly on SIGTERM', async () => {
    const logged = await say('T4 59in');
    expect(String(logged.body.text)).toMatch(/^T4: 59 in/);
    const digest = await api.waitFor(
      () => api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0OPS'),
      10_000,
    );
    expect(String(digest.params.text)).toContain('T4');

    child.kill('SIGTERM');
    const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
    expect(code).toBe(0);
    expect(stderr).toContain('SIGTERM, stopping');
  });
});

describe('tankrunway serve: Slack and Discord in one process', () => {
  it('registers the Discord command and routes each team digest to its own platform', async () => {
    const start = Date.parse('2026-12-01T06:59:58Z');
    const db = join(dir, 'both.sqlite');
    const store = openStore(db);
    const bot = createBot({ store });
    const discordChannel = '730000000000000099';
    for (const [team, channel] of [
      ['slack:T0BOTH', 'C0BOTH'],
      ['discord:710000000000000077', discordChannel],
    ] as const) {
      for (const text of [
        'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
        'T4 60in',
        'set digest 07:00 here',
      ]) {
        const replies = await bot.handle({
          team,
          channel,
          user: 'U0ANA',
          text,
          receivedAt: start - 3_600_000,
        });
        expect(replies[0]?.kind).toBe('confirmation');
      }
    }
    store.close();

    const api = await startWebApiStandIn();
    const gateway = await startGatewayStandIn({ applicationId: '700000000000000001' });
    const rest = await startRestStandIn({ gatewayUrl: gateway.url, applicationId: '700000000000000001' });
    const child = spawn(
      process.execPath,
      [bin, 'serve', '--db', db, '--tick-seconds', '0.2', '--now', new Date(start).toISOString()],
      {
        env: {
          ...baseEnv,
          SLACK_BOT_TOKEN: 'xoxb-both',
          SLACK_SIGNING_SECRET: signingSecret,
          SLACK_API_URL: api.apiUrl,
          PORT: '0',
          DISCORD_TOKEN: 'discord-test-token',
          DISCORD_APPLICATION_ID: '700000000000000001',
          DISCORD_API_URL: rest.apiUrl,
        },
        stdio: ['ignore', 'ignore', 'pipe'],
      },
    );
    let stderr = '';
    child.stderr?.on('data', (d: Buffer) => {
      stderr += d.toString('utf8');
    });
    try {
      await rest.waitFor((c) => c.method === 'PUT' && c.path.endsWith('/commands'), 20_000);
      const slackDigest = await api.waitFor(
        () => api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0BOTH'),
        20_000,
      );
      const discordDigest = await rest.waitFor(
        (c) => c.method === 'POST' && c.path === `/channels/${discordChannel}/messages`,
        20_000,
      );
      expect(String(slackDigest.params.text)).toContain('T4');
      expect(JSON.stringify(discordDigest.body)).toContain('T4');
      // Each digest went only to its own platform.
      expect(api.callsOf('chat.postMessage').some((c) => c.params.channel === discordChannel)).toBe(false);
      expect(rest.calls.some((c) => c.path.includes('C0BOTH'))).toBe(false);
      child.kill('SIGTERM');
      expect(await new Promise<number | null>((resolve) => child.once('exit', resolve))).toBe(0);
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
      await Promise.all([api.close(), rest.close(), gateway.close()]);
      if (!stderr.includes('Discord connected')) console.error(stderr);
    }
  }, 60_000);
});

describe('tankrunway serve: Discord in one development server', () => {
  it('registers the command in the server DISCORD_GUILD_ID names, not globally', async () => {
    const appId = '700000000000000001';
    const guild = '710000000000000077';
    const gateway = await startGatewayStandIn({ applicationId: appId });
    const rest = await startRestStandIn({ gatewayUrl: gateway.url, applicationId: appId });
    const child = spawn(process.execPath, [bin, 'serve', '--db', join(dir, 'guild.sqlite')], {
      env: {
        ...baseEnv,
        DISCORD_TOKEN: 'discord-test-token',
        DISCORD_APPLICATION_ID: appId,
        DISCORD_API_URL: rest.apiUrl,
        DISCORD_GUILD_ID: guild,
      },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr?.on('data', (d: Buffer) => {
      stderr += d.toString('utf8');
    });
    try {
      const put = await rest.waitFor((c) => c.method === 'PUT' && c.path.endsWith('/commands'), 20_000);
      expect(put.path).toBe(`/applications/${appId}/guilds/${guild}/commands`);
      expect(rest.calls.some((c) => c.path === `/applications/${appId}/commands`)).toBe(false);
      child.kill('SIGTERM');
      expect(await new Promise<number | null>((resolve) => child.once('exit', resolve))).toBe(0);
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
      await Promise.all([rest.close(), gateway.close()]);
      if (!stderr.includes('Discord connected')) console.error(stderr);
    }
  }, 60_000);
});

describe('tankrunway serve: Slack over Socket Mode', () => {
  it('connects out with the app-level token, answers a command envelope, and needs no signing secret', async () => {
    const api = await startWebApiStandIn();
    const socket = await startSocketStandIn();
    api.socketUrl = socket.url;
    const child = spawn(process.execPath, [bin, 'serve', '--db', join(dir, 'socket.sqlite')], {
      env: {
        ...baseEnv,
        SLACK_BOT_TOKEN: 'xoxb-sock',
        SLACK_APP_TOKEN: 'xapp-1-sock',
        SLACK_API_URL: api.apiUrl,
      },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    let stderr = '';
    child.stderr?.on('data', (d: Buffer) => {
      stderr += d.toString('utf8');
    });
    try {
      await api.waitFor(() => stderr.includes('Socket Mode'), 20_000);
      const c = { team: 'T0SOCK', channel: 'C0SOCK', user: 'U0BEN', text: 'help', id: 'sock-help' };
      const ack = await socket.push('slash_commands', commandFields(c, api.responseUrl(c.id)));
      expect(ack.envelope_id).toBeDefined();
      const help = await api.waitFor(() => api.responses.find((r) => r.id === c.id), 10_000);
      expect(help.body.response_type).toBe('ephemeral');
      expect(api.callsOf('apps.connections.open')[0]?.token).toBe('xapp-1-sock');
      child.kill('SIGTERM');
      expect(await new Promise<number | null>((resolve) => child.once('exit', resolve))).toBe(0);
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
      await Promise.all([api.close(), socket.close()]);
    }
  }, 60_000);
});
