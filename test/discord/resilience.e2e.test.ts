/**
 * The Discord adapter when things go slowly or wrong: a bot slower than the defer threshold, a private
 * answer after a public "thinking...", and a gateway connection that drops and resumes. Real discord.js and
 * the real bot on a temporary SQLite file, against the local stand-ins.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { COMMAND, embedOf, startWorld, TEAM, until, type World, where } from './harness.js';
import { chatInput, modalSubmit } from './interactionPayloads.js';

const DELAY_MS = 300;
let world: World;

beforeAll(async () => {
  world = await startWorld({
    // The real bot, made slower than the adapter's defer threshold (as a busy store would be).
    wrapBot: (bot) => ({
      handle: async (request) => {
        await new Promise((resolve) => setTimeout(resolve, DELAY_MS));
        return bot.handle(request);
      },
    }),
    deferAfterMs: 50,
  });
  // A tank to log against (demo scenario of our own: Kestrel Valley Water Co-op, Mill Creek Lift Station).
  const form = {
    code: 'MC1',
    shape: 'horizontal-cylinder diameter=1.2m length=2.5m',
    unit: 'L',
    product: 'water',
    site: 'Mill Creek Lift Station',
  };
  await world.interact(modalSubmit(where, 'tr-setup', form));
});

afterAll(async () => {
  await world?.stop();
});

describe('Discord adapter under delay and failure', () => {
  it('defers a slow answer, then edits in the confirmation', async () => {
    const { callback, edit } = await world.interact(
      chatInput(where, COMMAND, 'log', { tank: 'MC1', reading: '80cm' }),
    );
    expect(callback.type).toBe(5);
    expect(edit?.method).toBe('PATCH');
    expect(embedOf(edit)?.title).toMatch(/^MC1: /);
    const tank = world.store.tanks.byCode(TEAM, 'MC1');
    expect(tank && world.store.readings.forTank(TEAM, tank.id)).toHaveLength(1);
  });

  it('replaces a public "thinking..." with a private error, so only the sender sees it', async () => {
    const payload = chatInput(where, COMMAND, 'log', { tank: 'MC1', reading: '80 furlongs' });
    const { callback, edit } = await world.interact(payload);
    expect(callback.type).toBe(5);
    await until(() => world.rest.calls.some((c) => c.method === 'DELETE' && c.path.includes(payload.token)));
    expect(edit?.method).toBe('POST');
    expect((edit?.body as { flags?: number } | undefined)?.flags).toBe(64);
  });

  it('resumes after the gateway connection drops and keeps answering', async () => {
    world.gateway.dropConnections();
    await until(
      () =>
        world.gateway.connections >= 2 && world.gateway.resumes.length + world.gateway.identifies.length >= 2,
      15_000,
    );
    const { callback, edit } = await world.interact(chatInput(where, COMMAND, 'ask', { tank: 'MC1' }));
    expect(callback.type).toBe(5);
    expect(embedOf(edit)?.title).toContain('MC1');
    expect(world.logged.filter((l) => l.startsWith('interaction'))).toEqual([]);
  });
});
