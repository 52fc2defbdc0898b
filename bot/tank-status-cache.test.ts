import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RATE_STATE_VERSION, type RateEstimatorState } from '../engine/rate/index.js';
import { openStore, type Store } from './store/index.js';
import { type TankStatus, tankStatus } from './tank-status.js';

const HOUR = 3_600_000;
const T0 = Date.UTC(2026, 10, 1);
const spec = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

type Op =
  | { kind: 'read'; hours: number; level: number }
  | { kind: 'deliver'; hours: number; gal: number }
  | { kind: 'delete' }
  | { kind: 'hold' }
  | { kind: 'reshape'; diameter: number }
  | { kind: 'ask' };

const op: fc.Arbitrary<Op> = fc.oneof(
  {
    weight: 6,
    arbitrary: fc.record({
      kind: fc.constant('read' as const),
      hours: fc.integer({ min: 0, max: 400 }),
      level: fc.double({ min: 1, max: 71, noNaN: true }),
    }),
  },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant('deliver' as const),
      hours: fc.integer({ min: 0, max: 400 }),
      gal: fc.integer({ min: 10, max: 300 }),
    }),
  },
  { weight: 1, arbitrary: fc.constant({ kind: 'delete' as const }) },
  { weight: 1, arbitrary: fc.constant({ kind: 'hold' as const }) },
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant('reshape' as const),
      diameter: fc.integer({ min: 40, max: 60 }),
    }),
  },
  { weight: 3, arbitrary: fc.constant({ kind: 'ask' as const }) },
);

/**
 * What a reply says; the comparison ignores nothing a person reads. Through JSON, as the cache stores it:
 * -0 and 0 (which toEqual tells apart) read the same in every reply.
 */
const figures = (s: TankStatus) => JSON.parse(JSON.stringify(figuresOf(s)));
const figuresOf = (s: TankStatus) => ({
  latest: s.latest,
  rate: s.rate,
  runway: s.runway,
  refill: s.refill,
  events: s.events,
  readingCount: s.readingCount,
  skipped: s.skipped,
  history: s.history,
});

let dir: string;
let store: Store;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-cache-'));
  store = openStore(join(dir, 'bot.sqlite'));
  store.teams.ensure('t', T0);
});
afterAll(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

/** A level reading in inches on team 't', `hours` after T0. */
function addLevel(tankId: number, hours: number, inches: number, rawText = 'r'): void {
  store.readings.add(
    't',
    { tankId, time: T0 + hours * HOUR, kind: 'level', value: inches, unit: 'in', rawText, userId: 'u' },
    T0,
  );
}

describe('tankStatus with the rate cache', () => {
  it('says exactly what a computation from scratch says, after any sequence of changes', () => {
    let n = 0;
    let resumed = 0;
    fc.assert(
      fc.property(
        fc.array(op, { minLength: 1, maxLength: 40 }),
        fc.array(op, { maxLength: 4 }),
        (ops, more) => {
          const tank = store.tanks.add('t', { code: `T${n++}`, spec }, 'u', T0);
          const now = T0 + 500 * HOUR;
          // The ops, a question (which leaves a cache), a few more ops (which may or may not drop it).
          for (const o of [...ops, { kind: 'ask' as const }, ...more]) {
            if (o.kind === 'read') {
              const value = Math.round(o.level * 10) / 10;
              addLevel(tank.id, o.hours, value, `r ${value}`);
            } else if (o.kind === 'deliver') {
              store.deliveries.add(
                't',
                {
                  tankId: tank.id,
                  time: T0 + o.hours * HOUR,
                  volume: o.gal,
                  unit: 'gal',
                  rawText: 'd',
                  userId: 'u',
                },
                T0,
              );
            } else if (o.kind === 'delete' || o.kind === 'hold') {
              const newest = store.readings.newest('t', 1, tank.id)[0];
              if (newest && o.kind === 'delete') store.readings.softDelete('t', newest.id, T0);
              if (newest && o.kind === 'hold') store.readings.setStatus('t', newest.id, 'held');
            } else if (o.kind === 'reshape') {
              store.tanks.update('t', tank.id, { spec: { ...spec, diameter: o.diameter } }, T0);
            } else {
              tankStatus(store, 't', tank.id, now);
            }
          }
          if (store.rateCache.get('t', tank.id)) resumed++;
          const cached = figures(tankStatus(store, 't', tank.id, now)!);
          store.rateCache.drop('t', tank.id);
          const scratch = figures(tankStatus(store, 't', tank.id, now)!);
          expect(cached).toEqual(scratch);
        },
      ),
      { numRuns: Number(process.env.CACHE_RUNS ?? 60) },
    );
    // The comparison is only worth something if the cache was there to resume from.
    expect(resumed).toBeGreaterThanOrEqual(3);
  });

  it('rebuilds from the readings a cache an older engine wrote instead of resuming it', () => {
    const tank = store.tanks.add('t', { code: 'OLD', spec }, 'u', T0);
    const add = (h: number) =>
      addLevel(tank.id, h, Math.round((60 - h / 8 + (h % 24 < 9 ? 0.3 : 0)) * 10) / 10);
    for (let h = 0; h <= 60; h++) add(h);
    const now = T0 + 100 * HOUR;
    tankStatus(store, 't', tank.id, now);
    const entry = store.rateCache.get('t', tank.id)!;
    // What version 5 stored: no use part of the daily profile.
    const { useProfile: _u, useProfileSum: _s, ...rest } = store.rateCache.state('t', tank.id)!;
    const old = { ...rest, version: 5 } as unknown as RateEstimatorState;
    store.rateCache.put('t', tank.id, { ...entry, state: old });
    expect(store.rateCache.get('t', tank.id)?.summary.version).toBe(5);
    expect(store.rateCache.state('t', tank.id)).toBeUndefined();
    add(61);
    const answered = figures(tankStatus(store, 't', tank.id, now)!);
    expect(store.rateCache.get('t', tank.id)?.summary.version).toBe(RATE_STATE_VERSION);
    store.rateCache.drop('t', tank.id);
    expect(answered).toEqual(figures(tankStatus(store, 't', tank.id, now)!));
  });

  it('is dropped by the store when a reading arrives back in time', () => {
    const tank = store.tanks.add('t', { code: 'BACK', spec }, 'u', T0);
    const add = (h: number) => addLevel(tank.id, h, 50 - h / 10);
    add(0);
    add(10);
    tankStatus(store, 't', tank.id, T0 + 20 * HOUR);
    expect(store.rateCache.get('t', tank.id)?.asOfTime).toBe(T0 + 10 * HOUR);
    add(20);
    expect(store.rateCache.get('t', tank.id)).toBeDefined();
    add(5);
    expect(store.rateCache.get('t', tank.id)).toBeUndefined();
  });
});
