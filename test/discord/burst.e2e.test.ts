/**
 * A burst of interactions: the first is answered directly, every one arriving while others are being answered
 * is acknowledged at once ("thinking...") and filled in later, and every reading is stored exactly once. The
 * bot is the real one, made slow enough that the burst overlaps it; the defer timer is set out of reach, so
 * only the burst rule can explain a deferral.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP, COMMAND, embedOf, startWorld, TEAM, until, type World, where } from './harness.js';
import { chatInput, modalSubmit } from './interactionPayloads.js';

let world: World;

beforeAll(async () => {
  world = await startWorld({
    wrapBot: (bot) => ({
      handle: async (request) => {
        await new Promise((resolve) => setTimeout(resolve, 120));
        return bot.handle(request);
      },
    }),
    deferAfterMs: 60_000,
  });
  // Demo scenario of our own: Kestrel Valley Water Co-op, North Yard.
  const form = {
    code: 'NY2',
    shape: 'vertical-cylinder diameter=2m length=3m',
    unit: 'L',
    product: 'water',
    site: 'North Yard',
  };
  await world.interact(modalSubmit(where, 'tr-setup', form));
});

afterAll(async () => {
  await world?.stop();
});

describe('a burst of interactions', () => {
  it('answers the first directly, acknowledges the rest at once, and stores every reading once', async () => {
    const payloads = Array.from({ length: 8 }, (_, i) =>
      chatInput(where, COMMAND, 'log', {
        tank: 'NY2',
        reading: `${250 - i * 5}cm`,
        when: `2026-11-0${i + 1} 07:30`,
      }),
    );
    for (const p of payloads) world.gateway.dispatch('INTERACTION_CREATE', p);
    const callbackOf = (p: { id: string; token: string }) =>
      world.rest.calls.find((c) => !c.limited && c.path === `/interactions/${p.id}/${p.token}/callback`);
    const editOf = (p: { token: string }) =>
      world.rest.calls.find(
        (c) => c.method === 'PATCH' && c.path === `/webhooks/${APP}/${p.token}/messages/@original`,
      );
    await until(() => payloads.every((p) => callbackOf(p)), 10_000);
    const types = payloads.map((p) => (callbackOf(p)?.body as { type?: number } | undefined)?.type);
    expect(types).toEqual([4, 5, 5, 5, 5, 5, 5, 5]);
    await until(() => payloads.slice(1).every((p) => editOf(p)), 15_000);
    for (const p of payloads.slice(1)) expect(embedOf(editOf(p))?.title).toMatch(/^NY2: /);
    const tank = world.store.tanks.byCode(TEAM, 'NY2');
    expect(tank && world.store.readings.forTank(TEAM, tank.id, { includeHeld: true })).toHaveLength(8);
  });
});
