// The adapter only translates. These checks put a recording Bot (our own two-method interface) behind the real
// Bolt app and WebClient, and look at exactly what the bot was asked and what Slack was sent.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Bot } from '../../bot/bot.js';
import type { Reply } from '../../bot/replies/reply.js';
import type { Request } from '../../bot/request.js';
import { type SlackHarness, startSlackHarness } from './harness.js';

const confirmation: Reply = {
  kind: 'confirmation',
  visibility: 'channel',
  headline: 'T4 logged: 310 gal (62%)',
};
const problem: Reply = {
  kind: 'error',
  visibility: 'sender',
  headline: 'No tank called T44. Did you mean T4?',
};

function recordingBot(answer: (r: Request) => Reply[]): Bot & { asked: Request[] } {
  const asked: Request[] = [];
  return {
    asked,
    handle: async (r) => {
      asked.push(r);
      return answer(r);
    },
  };
}

let h: SlackHarness;
let bot: ReturnType<typeof recordingBot>;
beforeEach(async () => {
  bot = recordingBot((r) => (r.text.includes('T44') ? [problem] : [confirmation]));
  h = await startSlackHarness({ bot });
  h.api.users.set('U0ANA', { tz: 'America/Chicago' });
});
afterEach(async () => h.close());

describe('Slack adapter translation', () => {
  it('acks a slash command, asks the bot as team slack:<id> in the sender zone, and answers in channel', async () => {
    const res = await h.command({
      team: 'T0KESTREL',
      channel: 'C0RIDGE',
      user: 'U0ANA',
      text: 'T4 60in',
      id: 'c1',
    });
    expect(res.status).toBe(200);
    const post = await h.api.waitFor(() => h.api.responses.find((r) => r.id === 'c1'));
    expect(bot.asked[0]).toMatchObject({
      team: 'slack:T0KESTREL',
      channel: 'C0RIDGE',
      user: 'U0ANA',
      text: 'T4 60in',
      timeZone: 'America/Chicago',
      dedupeKey: 'command:trigger-c1',
    });
    expect(post.body).toMatchObject({ response_type: 'in_channel', text: 'T4 logged: 310 gal (62%)' });
    expect(JSON.stringify(post.body.blocks)).toContain('"type":"header"');
  });

  it('keeps errors to the sender', async () => {
    await h.command({ team: 'T0KESTREL', channel: 'C0RIDGE', user: 'U0ANA', text: 'T44 60in', id: 'c2' });
    const post = await h.api.waitFor(() => h.api.responses.find((r) => r.id === 'c2'));
    expect(post.body).toMatchObject({ response_type: 'ephemeral' });
  });

  it('reads a mention without the mention, replying in the thread; errors as ephemeral', async () => {
    const mention = {
      type: 'app_mention',
      user: 'U0ANA',
      channel: 'C0MILL',
      ts: '1764662400.000100',
      thread_ts: '1764662000.000001',
      team: 'T0KESTREL',
    };
    await h.event({ ...mention, text: '<@U0BOT> T4 60in' }, { team: 'T0KESTREL', eventId: 'Ev1' });
    await h.event(
      { ...mention, ts: '1764662400.000200', text: '<@U0BOT> T44 60in' },
      { team: 'T0KESTREL', eventId: 'Ev2' },
    );
    const posted = await h.api.waitFor(() => h.api.callsOf('chat.postMessage')[0]);
    const ephemeral = await h.api.waitFor(() => h.api.callsOf('chat.postEphemeral')[0]);
    expect(bot.asked.map((r) => [r.text, r.dedupeKey])).toEqual([
      ['T4 60in', 'message:C0MILL:1764662400.000100'],
      ['T44 60in', 'message:C0MILL:1764662400.000200'],
    ]);
    expect(posted.params).toMatchObject({
      channel: 'C0MILL',
      thread_ts: '1764662000.000001',
      text: 'T4 logged: 310 gal (62%)',
    });
    expect(ephemeral.params).toMatchObject({ channel: 'C0MILL', user: 'U0ANA' });
  });

  it('treats a button tap as the message in its value', async () => {
    await h.interaction({
      type: 'block_actions',
      team: { id: 'T0KESTREL', domain: 'kestrel' },
      user: { id: 'U0ANA', name: 'ana', team_id: 'T0KESTREL' },
      channel: { id: 'C0RIDGE', name: 'ridge' },
      trigger_id: 'trig-b1',
      response_url: h.api.responseUrl('b1'),
      actions: [
        {
          type: 'button',
          action_id: 'tankrunway:cmd:0:0',
          block_id: 'x',
          value: 'delivered 150 gal to T4',
          action_ts: '1',
        },
      ],
    });
    await h.api.waitFor(() => h.api.responses.find((r) => r.id === 'b1'));
    expect(bot.asked[0]).toMatchObject({
      text: 'delivered 150 gal to T4',
      dedupeKey: 'action:trig-b1',
      channel: 'C0RIDGE',
    });
  });
});
