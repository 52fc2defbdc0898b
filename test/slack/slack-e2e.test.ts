// End to end: the real Slack adapter (Bolt, WebClient) and the real bot on a temporary SQLite store, driven
// the way Slack drives an app (signed HTTP requests, a Web API that records every call). Demo names are our
// own invented scenario (Kestrel Valley Water Co-op).
import { DateTime } from 'luxon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { botScopes, scopeFor } from '../../adapters/slack/manifest.js';
import { digestFromStore } from '../../bot/schedule/digest.js';
import { createScheduler } from '../../bot/schedule/scheduler.js';
import type { Store } from '../../bot/store/index.js';
import { addHypo, mention, openSlackE2e, type SlackE2e } from './e2e-session.js';
import { command, type SlackHarness, signingSecret } from './harness.js';
import { slackSignature } from './signed-request.js';

let e: SlackE2e;
let h: SlackHarness;
let store: Store;
beforeAll(async () => {
  e = await openSlackE2e('tankrunway-slack-e2e-');
  ({ h, store } = e);
});
afterAll(() => e.close());
const say = (team: string, text: string, channel?: string) => e.say(team, text, channel);
const readingsOf = (team: string) => e.readingsOf(team);

describe('Slack, end to end over HTTP', () => {
  it('logs a reading from a slash command and confirms it to the channel, in the sender zone', async () => {
    await say('T0READ', addHypo);
    const reply = await say('T0READ', 'T4 60in');
    expect(reply.body.response_type).toBe('in_channel');
    expect(String(reply.body.text)).toMatch(/^T4: 60 in = \d+ gal/);
    expect(readingsOf('slack:T0READ')).toHaveLength(1);
    expect(h.api.callsOf('users.info').some((c) => c.params.user === 'U0ANA')).toBe(true);
  });

  it('answers a runway question asked by mention with blocks and an uploaded chart', async () => {
    await say('T0ASK', addHypo);
    await say('T0ASK', 'T4 62in at yesterday 8am');
    await say('T0ASK', 'T4 55in');
    await h.event(mention('T0ASK', 'C0ASK', '1764662400.000100', 'T4?'), {
      team: 'T0ASK',
      eventId: 'EvAsk1',
    });
    const post = await h.api.waitFor(() =>
      h.api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0ASK'),
    );
    expect(String(post.params.text)).toContain('runway');
    const blocks = post.params.blocks as { type: string }[];
    expect(blocks[0]?.type).toBe('header');
    expect(blocks.some((b) => b.type === 'section')).toBe(true);
    // files.uploadV2 is three calls: get an upload URL, send the bytes there, complete into the channel.
    const complete = await h.api.waitFor(() =>
      h.api.callsOf('files.completeUploadExternal').find((c) => c.params.channel_id === 'C0ASK'),
    );
    const [file] = complete.params.files as { id: string }[];
    const png = h.api.uploads.get(file?.id ?? '');
    expect(png?.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])); // PNG signature
  });

  it('still answers when the chart cannot be shared in the channel, and tells the sender why', async () => {
    h.api.failWith('files.completeUploadExternal', 'not_in_channel', 1, (p) => p.channel_id === 'C0ELSE');
    const answer = await say('T0ASK', 'T4?', 'C0ELSE');
    expect(answer.body.response_type).toBe('in_channel');
    // Both go to the command's response_url: the answer for the channel, then the note for the sender.
    const note = await h.api.waitFor(() =>
      h.api.responses.find((r) => r.id === answer.id && r.body.response_type === 'ephemeral'),
    );
    expect(String(note.body.text)).toContain('/invite');
  });

  it('keeps a mistake between the bot and the sender (ephemeral)', async () => {
    await h.event(mention('T0ASK', 'C0ASK', '1764662400.000200', 'T44 3in'), {
      team: 'T0ASK',
      eventId: 'EvAsk2',
    });
    const eph = await h.api.waitFor(() =>
      h.api.callsOf('chat.postEphemeral').find((c) => c.params.channel === 'C0ASK'),
    );
    expect(eph.params.user).toBe('U0ANA');
    expect(String(eph.params.text)).toContain('Did you mean T4?');
  });

  it('stores a redelivered event once (same event_id, and the same message under another event)', async () => {
    await say('T0RETRY', addHypo);
    const event = mention('T0RETRY', 'C0RETRY', '1764662400.000300', 'T4 58in');
    expect((await h.event(event, { team: 'T0RETRY', eventId: 'EvR1' })).status).toBe(200);
    expect((await h.event(event, { team: 'T0RETRY', eventId: 'EvR1' }, { retryNum: 1 })).status).toBe(200);
    expect((await h.event(event, { team: 'T0RETRY', eventId: 'EvR2' }, { retryNum: 2 })).status).toBe(200);
    await h.api.waitFor(
      () => h.api.callsOf('chat.postMessage').filter((c) => c.params.channel === 'C0RETRY').length >= 3,
    );
    expect(readingsOf('slack:T0RETRY')).toHaveLength(1);
  });

  it('refuses forged, stale and future-dated signatures with 401 and stores nothing', async () => {
    const now = Math.floor(Date.now() / 1000);
    const send = (sign: { secret?: string; timestamp?: number; signature?: string }) =>
      h.command(
        {
          team: 'T0SIGN',
          channel: 'C0SIGN',
          user: 'U0EVE',
          text: addHypo,
          id: `sign-${JSON.stringify(sign).length}`,
        },
        sign,
      );
    const forged = await send({ secret: 'not-the-signing-secret' });
    const stale = await send({ timestamp: now - 10 * 60 });
    const future = await send({ timestamp: now + 10 * 60 });
    const garbage = await send({ signature: 'v0=00' });
    expect([forged.status, stale.status, future.status, garbage.status]).toEqual([401, 401, 401, 401]);
    // The future one was signed correctly: only our own check refuses it.
    expect(slackSignature(signingSecret, now + 600, 'x')).toMatch(/^v0=[0-9a-f]{64}$/);
    await new Promise((r) => setTimeout(r, 100));
    expect(store.teams.list().map((t) => t.id)).not.toContain('slack:T0SIGN');
    expect(h.api.responses.filter((r) => r.id.startsWith('sign-'))).toHaveLength(0);
  });

  it('waits out a 429 for one team without holding up another', async () => {
    for (const team of ['T0RATEA', 'T0RATEB']) await say(team, addHypo);
    h.api.rateLimit('chat.postMessage', 1, 1, (p) => p.channel === 'C0RATEA');
    await h.event(mention('T0RATEA', 'C0RATEA', '1764662400.000400', 'T4 50in'), {
      team: 'T0RATEA',
      eventId: 'EvRA',
    });
    const limited = await h.api.waitFor(() =>
      h.api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0RATEA'),
    );
    await h.event(mention('T0RATEB', 'C0RATEB', '1764662400.000500', 'T4 50in'), {
      team: 'T0RATEB',
      eventId: 'EvRB',
    });
    const b = await h.api.waitFor(() =>
      h.api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0RATEB'),
    );
    const aCalls = await h.api.waitFor(() => {
      const calls = h.api.callsOf('chat.postMessage').filter((c) => c.params.channel === 'C0RATEA');
      return calls.length >= 2 && calls;
    });
    const retried = aCalls[1];
    expect(b.at).toBeLessThan(retried?.at ?? 0); // team B was not paused behind team A
    expect((retried?.at ?? 0) - limited.at).toBeGreaterThanOrEqual(950); // A waited for Retry-After: 1
    expect(readingsOf('slack:T0RATEA')).toHaveLength(1);
  });

  it('does not wait for a rate-limited zone lookup: the team zone stands in', async () => {
    await say('T0ZONE', addHypo);
    h.api.rateLimit('users.info', 30, 1, (p) => p.user === 'U0ZED');
    const res = await h.command({
      team: 'T0ZONE',
      channel: 'C0MILL',
      user: 'U0ZED',
      text: 'T4 61in',
      id: 'zed',
    });
    expect(res.status).toBe(200);
    // Answered within the stand-in's 5 s wait, not after the 30 s Retry-After.
    const reply = await h.api.waitFor(() => h.api.responses.find((r) => r.id === 'zed'));
    expect(String(reply.body.text)).toMatch(/^T4: 61 in/);
  });

  it('posts the morning digest to the team channel through the scheduler', async () => {
    await say('T0DIGEST', addHypo, 'C0OPS');
    await say('T0DIGEST', 'set time zone America/Chicago', 'C0OPS');
    await say('T0DIGEST', 'set digest 07:00 here', 'C0OPS');
    await say('T0DIGEST', 'T4 60in', 'C0OPS');
    const sevenAm = DateTime.now()
      .setZone('America/Chicago')
      .plus({ days: 1 })
      .set({ hour: 7, minute: 0, second: 0, millisecond: 0 });
    const scheduler = createScheduler({
      store,
      deliver: (team, channel, replies) => h.adapter.deliver(team, channel, replies),
      clock: () => sevenAm.toMillis(),
      graceMinutes: 60,
      composeDigest: digestFromStore,
    });
    await scheduler.tick(sevenAm.toMillis() + 60_000);
    scheduler.release();
    const posted = await h.api.waitFor(() =>
      h.api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0OPS'),
    );
    expect(String(posted.params.text)).toContain('T4');
  });

  it('draws the home tab: the team tanks, shortest runway first, and no other team tanks', async () => {
    for (const code of ['A1', 'B2']) await say('T0HOME', addHypo.replace('T4', code));
    await say('T0HOME', 'A1 60in at yesterday 8am');
    await say('T0HOME', 'A1 59in');
    await say('T0HOME', 'B2 60in at yesterday 8am');
    await say('T0HOME', 'B2 56in');
    await h.event(
      { type: 'app_home_opened', user: 'U0ANA', channel: 'D0HOME', tab: 'home', event_ts: '1764662400.1' },
      { team: 'T0HOME', eventId: 'EvHome' },
    );
    const publish = await h.api.waitFor(() =>
      h.api.callsOf('views.publish').find((c) => c.params.user_id === 'U0ANA'),
    );
    const json = JSON.stringify(publish.params.view);
    expect(json).toContain('Tanks by runway');
    expect(json).toContain('tankrunway:open-setup');
    const table = /```(.*?)```/.exec(json)?.[1] ?? '';
    const rows = table
      .split('\\n')
      .slice(2)
      .map((line) => line.split(/\s+/)[0]);
    expect(rows).toEqual(['B2', 'A1']); // T4 of the other teams never shows
  });

  it('survives signed requests that lack their parts or are not Slack payloads at all', async () => {
    const form = 'application/x-www-form-urlencoded' as const;
    const { postSigned } = await import('./signed-request.js');
    const noTeam = new URLSearchParams({
      command,
      text: 'T4 60in',
      channel_id: 'C0ODD',
      user_id: 'U0ODD',
      trigger_id: 'odd',
      response_url: h.api.responseUrl('odd'),
    });
    expect((await postSigned(h.eventsUrl, noTeam.toString(), form, { secret: signingSecret })).status).toBe(
      200,
    );
    const bad = await postSigned(h.eventsUrl, '{"type":', 'application/json', { secret: signingSecret });
    expect(bad.status).toBeGreaterThanOrEqual(400);
    const noText = mention('T0READ', 'C0ODD', '1764662400.000600', 'x');
    await h.event({ ...noText, text: undefined }, { team: 'T0READ', eventId: 'EvOdd' });
    await new Promise((r) => setTimeout(r, 100));
    expect(store.teams.list().some((t) => t.id.includes('undefined'))).toBe(false);
    expect(h.api.responses.some((r) => r.id === 'odd')).toBe(false);
    // The adapter still works afterwards.
    const reply = await say('T0READ', 'T4 59in');
    expect(String(reply.body.text)).toMatch(/^T4: 59 in/);
  });

  it('needed exactly the scopes the manifest asks for', () => {
    const methods = new Set(h.api.calls.map((c) => c.method));
    for (const m of methods) expect(Object.keys(scopeFor)).toContain(m);
    const used = [...methods].map((m) => scopeFor[m as keyof typeof scopeFor]);
    used.push(scopeFor['slash command'], scopeFor['app_mention event']);
    expect([...new Set(used.filter((s) => s !== undefined))].sort()).toEqual(botScopes);
  });
});
