// Modals and buttons end to end: the real adapter and bot; a submitted form becomes messages in the bot's
// language, and a button tap is the message in its value.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Store } from '../../bot/store/index.js';
import { addHypo, openSlackE2e, type SlackE2e } from './e2e-session.js';
import type { SlackHarness } from './harness.js';

let e: SlackE2e;
let h: SlackHarness;
let store: Store;
beforeAll(async () => {
  e = await openSlackE2e('tankrunway-slack-modals-');
  ({ h, store } = e);
});
afterAll(() => e.close());
const say = (team: string, text: string, channel?: string) => e.say(team, text, channel);
const readingsOf = (team: string) => e.readingsOf(team);

describe('Slack modals and buttons, end to end', () => {
  it('sets a tank up through the modal, showing a mistake on the form first', async () => {
    await say('T0SETUP', 'T9?'); // the team exists; its first user is the admin
    await h.command({ team: 'T0SETUP', channel: 'C0RIDGE', user: 'U0ANA', text: 'setup', id: 'setup-open' });
    const open = await h.api.waitFor(() =>
      h.api.callsOf('views.open').find((c) => c.params.trigger_id === 'trigger-setup-open'),
    );
    const view = open.params.view as { callback_id: string; private_metadata: string };
    expect(view.callback_id).toBe('tankrunway:setup');
    const submit = (tank: string, diameter: string) =>
      h.interaction({
        type: 'view_submission',
        team: { id: 'T0SETUP', domain: 'kestrel' },
        user: { id: 'U0ANA', name: 'ana', team_id: 'T0SETUP' },
        api_app_id: 'A0TANK',
        trigger_id: 'trig-view',
        view: {
          id: 'V0SETUP',
          team_id: 'T0SETUP',
          type: 'modal',
          callback_id: view.callback_id,
          private_metadata: view.private_metadata,
          hash: 'h1',
          state: {
            values: {
              tank: { value: { type: 'plain_text_input', value: tank } },
              shape: { value: { type: 'static_select', selected_option: { value: 'vertical-cylinder' } } },
              diameter: { value: { type: 'plain_text_input', value: diameter } },
              length: { value: { type: 'plain_text_input', value: '8ft' } },
              unit: { value: { type: 'static_select', selected_option: { value: 'gal' } } },
              product: { value: { type: 'plain_text_input', value: 'diesel' } },
              site: { value: { type: 'plain_text_input', value: 'Ridge Pump Station' } },
            },
          },
        },
      });
    const wrong = await submit('GEN1', '5 furlongs');
    expect(wrong.status).toBe(200);
    expect(JSON.parse(wrong.text)).toMatchObject({ response_action: 'errors' });
    expect(store.tanks.list('slack:T0SETUP')).toHaveLength(0);

    const right = await submit('GEN1', '5ft');
    expect(right.status).toBe(200);
    expect(right.text).toBe('');
    const confirmed = await h.api.waitFor(() =>
      h.api.callsOf('chat.postMessage').find((c) => c.params.channel === 'C0RIDGE'),
    );
    expect(String(confirmed.params.text)).toContain('GEN1');
    // Diesel: the reply carries the usual caution, deferring to local codes.
    expect(JSON.stringify(confirmed.params.blocks)).toContain('context');
    expect(store.tanks.list('slack:T0SETUP').map((t) => t.code)).toEqual(['GEN1']);
  });

  it('applies the settings modal as set messages and answers a button tap like the typed message', async () => {
    await say('T0SET', addHypo, 'C0SET');
    const values = (fields: Record<string, string>) =>
      Object.fromEntries(
        Object.entries(fields).map(([k, v]) => [k, { value: { type: 'plain_text_input', value: v } }]),
      );
    const res = await h.interaction({
      type: 'view_submission',
      team: { id: 'T0SET', domain: 'kestrel' },
      user: { id: 'U0ANA', name: 'ana', team_id: 'T0SET' },
      api_app_id: 'A0TANK',
      trigger_id: 'trig-settings',
      view: {
        id: 'V0SET',
        team_id: 'T0SET',
        type: 'modal',
        callback_id: 'tankrunway:settings',
        private_metadata: JSON.stringify({ channel: 'C0SET' }),
        hash: 'h2',
        state: { values: values({ tank: 'T4', threshold: '25%', 'time-zone': 'America/Chicago' }) },
      },
    });
    expect(res.status).toBe(200);
    const posts = await h.api.waitFor(() => {
      const found = h.api.callsOf('chat.postMessage').filter((c) => c.params.channel === 'C0SET');
      return found.length >= 2 && found;
    });
    expect(posts.map((p) => String(p.params.text).split('\n')[0])).toEqual([
      expect.stringContaining('threshold 25'),
      expect.stringContaining('America/Chicago'),
    ]);
    expect(store.teams.list().find((t) => t.id === 'slack:T0SET')?.timeZone).toBe('America/Chicago');

    // A reading's confirmation carries an Undo button; tapping it sends `undo` as that person.
    const logged = await say('T0SET', 'T4 50in', 'C0SET');
    const buttons = (
      logged.body.blocks as { type: string; elements?: { action_id: string; value: string }[] }[]
    )
      .filter((b) => b.type === 'actions')
      .flatMap((b) => b.elements ?? []);
    const undo = buttons.find((b) => b.value === 'undo');
    expect(undo).toBeDefined();
    expect(readingsOf('slack:T0SET')).toHaveLength(1);
    await h.interaction({
      type: 'block_actions',
      team: { id: 'T0SET', domain: 'kestrel' },
      user: { id: 'U0ANA', name: 'ana', team_id: 'T0SET' },
      channel: { id: 'C0SET', name: 'hypo' },
      trigger_id: 'trig-undo',
      response_url: h.api.responseUrl('undo-1'),
      actions: [
        { type: 'button', action_id: undo?.action_id, block_id: 'b', value: undo?.value, action_ts: '2' },
      ],
    });
    await h.api.waitFor(() => h.api.responses.find((r) => r.id === 'undo-1'));
    expect(
      store.tanks.list('slack:T0SET').flatMap((t) => store.readings.forTank('slack:T0SET', t.id)),
    ).toHaveLength(0);
  });
});
