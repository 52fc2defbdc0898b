// Socket Mode end to end: the real SocketModeClient inside Bolt connects to a local websocket that speaks
// Slack's Socket Mode protocol (hello, envelopes, acks by envelope_id, disconnect), with the real bot behind it.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { commandFields, eventEnvelope, type SlackHarness, startSlackHarness } from './harness.js';

let dir: string;
let store: Store;
let h: SlackHarness;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tankrunway-slack-socket-'));
  store = openStore(join(dir, 'socket.sqlite'));
  h = await startSlackHarness({ bot: createBot({ store }), socketMode: true });
});
afterAll(async () => {
  await h.close();
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

const team = 'T0SOCKET';
const readings = () =>
  store.tanks
    .list(`slack:${team}`)
    .flatMap((t) => store.readings.forTank(`slack:${team}`, t.id, { includeHeld: true }));

async function command(text: string, id: string) {
  const socket = h.socket!;
  const ack = await socket.push(
    'slash_commands',
    commandFields({ team, channel: 'C0NORTH', user: 'U0BEN', text, id }, h.api.responseUrl(id)),
  );
  await h.api.waitFor(() => h.api.responses.find((r) => r.id === id));
  return ack;
}

describe('Slack over Socket Mode', () => {
  it('acks a slash command envelope and logs the reading', async () => {
    const socket = h.socket!;
    await socket.waitForConnections(1);
    expect(h.api.callsOf('apps.connections.open')[0]?.token).toBe('xapp-1-kestrel-test');
    await command(
      'add tank W1 rectangular width=4ft length=6ft height=5ft unit=gal product=water site="North Yard"',
      's1',
    );
    const ack = await command('W1 40in', 's2');
    expect(typeof ack.envelope_id).toBe('string');
    expect(readings()).toHaveLength(1);
  });

  it('handles a redelivered event once', async () => {
    const event = {
      type: 'app_mention',
      user: 'U0BEN',
      team,
      channel: 'C0NORTH',
      ts: '1764662400.000900',
      text: '<@U0BOT> W1 38in',
    };
    const envelope = eventEnvelope(event, { team, eventId: 'EvSock1' });
    await h.socket!.push('events_api', envelope);
    await h.socket!.push('events_api', envelope, 1);
    // Each delivery is answered (the second with the first's replies); a suspect reading is asked about privately.
    const answered = () =>
      h.api.calls.filter((c) => c.method.startsWith('chat.post') && c.params.channel === 'C0NORTH');
    await h.api.waitFor(() => answered().length >= 2);
    expect(readings()).toHaveLength(2);
  });

  it('reconnects after a dropped socket and after a disconnect request, and keeps working', async () => {
    const socket = h.socket!;
    const before = socket.connections;
    socket.dropAll();
    await socket.waitForConnections(before + 1);
    await command('W1 37in', 's3');
    socket.askToReconnect();
    await socket.waitForConnections(before + 2);
    await command('W1 36in', 's4');
    expect(readings()).toHaveLength(4);
  });
});
