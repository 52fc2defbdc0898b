/**
 * The Discord adapter end to end: discord.js 14 logs in to a local gateway websocket and calls a local REST
 * stand-in (chat-platforms.md, "Testing both adapters with no internet"); the real bot answers on a
 * temporary SQLite file. Nothing inside discord.js is mocked: the protocol on the wire is what is checked.
 */
import { DateTime } from 'luxon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { digestFromStore } from '../../bot/schedule/digest.js';
import { createScheduler } from '../../bot/schedule/scheduler.js';
import {
  APP,
  type Callback,
  CHANNEL,
  COMMAND,
  type Embed,
  GUILD,
  startWorld,
  TEAM,
  until,
  type World,
  where,
} from './harness.js';
import { autocomplete, buttonClick, chatInput, modalSubmit } from './interactionPayloads.js';

const OTHER_GUILD = '720000000000000003';

/** Demo scenario of our own invention: Kestrel Valley Water Co-op, the diesel day tank at Ridge Pump Station. */
const T4_FORM = {
  code: 'T4',
  shape: 'vertical-cylinder diameter=48in length=72in',
  unit: 'gal',
  product: 'diesel',
  site: 'Ridge Pump Station',
};

let world: World;
const interact = (payload: { id: string; token: string }) => world.interact(payload);
const firstEmbed = (c: Callback): Embed => c.data?.embeds?.[0] ?? {};
const tankT4 = () => world.store.tanks.byCode(TEAM, 'T4');
const readingsOfT4 = () => {
  const tank = tankT4();
  return tank ? world.store.readings.forTank(TEAM, tank.id, { includeHeld: true }) : [];
};

beforeAll(async () => {
  world = await startWorld();
});

afterAll(async () => {
  await world?.stop();
});

describe('Discord adapter against local gateway and REST stand-ins', () => {
  it('identifies over the gateway and registers the command in the development guild by bulk PUT', async () => {
    expect(world.gateway.identifies).toHaveLength(1);
    const put = await world.rest.waitFor((c) => c.method === 'PUT');
    expect(put.path).toBe(`/applications/${APP}/guilds/${GUILD}/commands`);
    const [command] = put.body as { name: string; options: { name: string }[] }[];
    expect(command?.name).toBe(COMMAND);
    expect(command?.options.map((o) => o.name)).toContain('log');
  });

  it('sets up a tank through the modal, which becomes an add-tank message', async () => {
    const open = await interact(chatInput(where, COMMAND, 'setup'));
    expect(open.callback.type).toBe(9);
    expect(open.callback.data?.custom_id).toBe('tr-setup');
    const submitted = await interact(modalSubmit(where, 'tr-setup', T4_FORM));
    expect(submitted.callback.type).toBe(4);
    expect(firstEmbed(submitted.callback).title).toContain('T4');
    expect(tankT4()?.product).toBe('diesel');
  });

  it('sets the team time zone explicitly', async () => {
    const { callback } = await interact(chatInput(where, COMMAND, 'timezone', { zone: 'America/Chicago' }));
    expect(callback.type).toBe(4);
    expect(world.store.teams.get(TEAM)?.timeZone).toBe('America/Chicago');
  });

  it('logs a reading and confirms it in the channel', async () => {
    const { callback } = await interact(
      chatInput(where, COMMAND, 'log', { tank: 'T4', reading: '60in', when: '2026-11-02 07:30' }),
    );
    expect(callback.type).toBe(4);
    expect(callback.data?.flags ?? 0).toBe(0);
    expect(firstEmbed(callback).title).toMatch(/^T4: /);
    expect(readingsOfT4()).toHaveLength(1);
    const local = DateTime.fromMillis(readingsOfT4()[0]?.time ?? 0, { zone: 'America/Chicago' });
    expect(local.toFormat('yyyy-MM-dd HH:mm')).toBe('2026-11-02 07:30');
  });

  it('stores a replayed interaction once', async () => {
    const payload = chatInput(where, COMMAND, 'log', {
      tank: 'T4',
      reading: '52.3in',
      when: '2026-11-05 08:10',
    });
    const first = await interact(payload);
    // The gateway delivers the same interaction again (as after a resume): same id, same token.
    world.gateway.dispatch('INTERACTION_CREATE', payload);
    const callbackPath = `/interactions/${payload.id}/${payload.token}/callback`;
    await until(() => world.rest.calls.filter((c) => c.path === callbackPath).length === 2);
    expect(readingsOfT4()).toHaveLength(2);
    expect(firstEmbed(first.callback).title).toMatch(/^T4: /);
  });

  it('logs a delivery and another reading, then answers a question with an embed and the chart attached', async () => {
    const delivery = await interact(
      chatInput(where, COMMAND, 'delivery', { tank: 'T4', amount: '150 gal', when: '2026-11-06 10:00' }),
    );
    expect(delivery.callback.type).toBe(4);
    await interact(
      chatInput(where, COMMAND, 'log', { tank: 'T4', reading: '61.2in', when: '2026-11-09 07:45' }),
    );
    const { callback, edit } = await interact(chatInput(where, COMMAND, 'ask', { tank: 'T4' }));
    expect(callback.type).toBe(5); // deferred: the chart may take longer than Discord waits
    const embed = (edit?.body as { embeds?: Embed[] } | undefined)?.embeds?.[0];
    expect(embed?.title).toContain('T4');
    expect(JSON.stringify(embed?.fields)).toMatch(/gal/);
    expect(embed?.fields?.some((f) => f.name === 'Caution' && /local codes/.test(f.value))).toBe(true);
    expect(embed?.image?.url).toBe('attachment://level-chart-1.png');
    const png = edit?.files[0];
    expect(png?.name).toBe('level-chart-1.png');
    const attachments = (
      edit?.body as { attachments?: { filename: string; description?: string }[] } | undefined
    )?.attachments;
    expect(attachments?.[0]?.description).toMatch(/^Level chart of T4/);
    // PNG signature (W3C PNG specification, section 5.2).
    expect([...(png?.bytes.subarray(0, 8) ?? [])]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  });

  it('completes tank names for the guild that asks, and only its own', async () => {
    const { callback } = await interact(autocomplete(where, COMMAND, 'ask', { tank: 't' }, 'tank'));
    expect(callback.type).toBe(8);
    expect(callback.data?.choices?.map((c) => c.value)).toContain('T4');
    const other = await interact(
      autocomplete({ ...where, guildId: OTHER_GUILD }, COMMAND, 'ask', { tank: 't' }, 'tank'),
    );
    expect(other.callback.data?.choices).toEqual([]);
  });

  it('answers a bad option privately with what to fix, storing nothing', async () => {
    const before = readingsOfT4().length;
    const { callback } = await interact(
      chatInput(where, COMMAND, 'log', { tank: 'T4', reading: '12 parsecs' }),
    );
    expect(callback.type).toBe(4);
    expect(callback.data?.flags).toBe(64);
    expect(firstEmbed(callback).title?.length).toBeGreaterThan(10);
    expect(readingsOfT4()).toHaveLength(before);
  });

  it('runs a button press as the message it carries', async () => {
    const { callback, edit } = await interact(buttonClick(where, 'tr:T4?'));
    const embed = edit ? (edit.body as { embeds: Embed[] }).embeds[0] : firstEmbed(callback);
    expect(embed?.title).toContain('T4');
  });

  it('waits out a 429 from REST and still answers', async () => {
    world.rest.rateLimit(/^POST \/interactions\/.*\/callback$/, 0.3);
    const payload = chatInput(where, COMMAND, 'help', {});
    const { callback } = await interact(payload);
    expect(callback.type).toBe(4);
    const tries = world.rest.calls.filter(
      (c) => c.path === `/interactions/${payload.id}/${payload.token}/callback`,
    );
    expect(tries.map((c) => c.limited)).toEqual([true, false]);
  });

  it('posts a digest from the scheduler to the channel, once, with a nonce', async () => {
    await interact(chatInput(where, COMMAND, 'settings', { setting: 'digest 07:00 here' }));
    const scheduler = createScheduler({
      store: world.store,
      clock: () => Date.now(),
      graceMinutes: 120,
      composeDigest: digestFromStore,
      deliver: (_team, channel, replies, meta) => world.adapter.deliver(channel, replies, { key: meta.key }),
    });
    const posts = () =>
      world.rest.calls.filter((c) => !c.limited && c.path === `/channels/${CHANNEL}/messages`);
    const tomorrow = DateTime.now().setZone('America/Chicago').plus({ days: 1 }).set({ hour: 7, minute: 5 });
    const report = await scheduler.tick(tomorrow.toMillis());
    // The digest, and any notice the scheduler owes the channel (T4's readings are overdue by then).
    expect(report.delivered.filter((p) => p.kind === 'digest')).toHaveLength(1);
    expect(posts()).toHaveLength(report.delivered.length);
    const digest = posts().find((c) =>
      /digest/i.test((c.body as { embeds: Embed[] }).embeds[0]?.title ?? ''),
    );
    const body = digest?.body as { embeds: Embed[]; nonce: string; enforce_nonce: boolean };
    expect(body.enforce_nonce).toBe(true);
    expect(body.nonce.length).toBeLessThanOrEqual(25);
    expect(body.embeds[0]?.description).toContain('T4');
    await scheduler.tick(tomorrow.plus({ minutes: 1 }).toMillis());
    expect(posts()).toHaveLength(report.delivered.length);
    scheduler.release();
  });

  it('does not hold up another guild while one channel is rate limited', async () => {
    world.rest.rateLimit(/^POST \/channels\/750000000000000006\/messages$/, 1);
    const notice = {
      kind: 'notice' as const,
      visibility: 'channel' as const,
      headline: 'T4 reaches its reorder point tomorrow',
    };
    const started = Date.now();
    const finished: Record<string, number> = {};
    await Promise.all([
      world.adapter.deliver('750000000000000006', [notice], { key: 'slow' }).then(() => {
        finished.slow = Date.now() - started;
      }),
      world.adapter.deliver('760000000000000007', [notice], { key: 'fast' }).then(() => {
        finished.fast = Date.now() - started;
      }),
    ]);
    expect(finished.slow).toBeGreaterThanOrEqual(900);
    expect(finished.fast).toBeLessThan(finished.slow ?? 0);
    expect(finished.fast).toBeLessThan(800);
  });

  it('answers an unknown subcommand and a message from outside a server privately, storing nothing', async () => {
    const before = readingsOfT4().length;
    const unknown = await interact(chatInput(where, COMMAND, 'explode', { tank: 'T4' }));
    expect(unknown.callback.data?.flags).toBe(64);
    const dm = chatInput(where, COMMAND, 'log', { tank: 'T4', reading: '50in' }) as Record<string, unknown>;
    delete dm.guild_id;
    delete dm.member;
    delete dm.channel;
    dm.user = { id: '740000000000000005', username: 'dana', discriminator: '0', avatar: null };
    dm.context = 1;
    const direct = await interact(dm as { id: string; token: string });
    expect(direct.callback.data?.flags).toBe(64);
    expect(firstEmbed(direct.callback).title).toMatch(/server/);
    expect(readingsOfT4()).toHaveLength(before);
  });

  it('ignores another application command name', async () => {
    const payload = chatInput(where, 'someone-else', 'log', { tank: 'T4', reading: '50in' });
    world.gateway.dispatch('INTERACTION_CREATE', payload);
    const probe = await interact(chatInput(where, COMMAND, 'help'));
    expect(probe.callback.type).toBe(4);
    expect(world.rest.calls.some((c) => c.path.includes(payload.token))).toBe(false);
  });

  it('keeps running after a client error event', () => {
    world.adapter.client.emit('error', new Error('stand-in failure'));
    expect(world.logged.some((l) => l.includes('stand-in failure'))).toBe(true);
  });
});
