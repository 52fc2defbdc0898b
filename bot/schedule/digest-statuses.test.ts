import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from '../store/index.js';
import type { TankSettings } from '../store/types.js';
import { type TankStatus, tankStatus } from '../tank-status.js';
import { composeDigest } from './digest.js';
import { DIGEST_HISTORY_READINGS } from './digest-sections.js';
import { digestStatuses } from './digest-statuses.js';

// Random teams in our invented demo scenario (Kestrel Valley Water Co-op sites); the fast digest path must
// give exactly the statuses, and so the digest, that `tankStatus` gives tank by tank.
const DAY = 86_400_000;
const HOUR = 3_600_000;
const NOW = Date.parse('2026-12-02T13:00:00Z');
const SITES = ['Ridge Pump Station', 'Mill Creek Lift Station', 'North Yard'];
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
});
afterEach(() => temp.cleanup());

const tankArb = fc.record({
  product: fc.constantFrom('diesel', 'sodium hypochlorite 12.5%', 'potable water', 'wastewater sludge'),
  threshold: fc.option(fc.integer({ min: 5, max: 60 }), { nil: undefined }),
  leadTimeDays: fc.integer({ min: 0, max: 10 }),
  businessDays: fc.boolean(),
  filling: fc.boolean(),
  // Readings: hours after the first one and gallons (some spikes, some above the drum's 564 gal).
  readings: fc.array(fc.tuple(fc.integer({ min: 1, max: 96 }), fc.integer({ min: 0, max: 600 })), {
    maxLength: 25,
  }),
  deliveries: fc.array(fc.tuple(fc.integer({ min: 0, max: 40 * 24 }), fc.integer({ min: 1, max: 300 })), {
    maxLength: 2,
  }),
  startDaysAgo: fc.integer({ min: 0, max: 40 }),
});

type TankCase = typeof tankArb extends fc.Arbitrary<infer T> ? T : never;

function seedTeam(team: string, zone: string, tanks: TankCase[]): void {
  store.transaction(() => {
    store.teams.ensure(team, NOW - 90 * DAY, { name: 'Kestrel Valley Water Co-op', timeZone: zone });
    tanks.forEach((t, i) => {
      const settings: TankSettings = {
        leadTimeDays: t.leadTimeDays,
        businessDays: t.businessDays,
        ...(t.threshold !== undefined ? { threshold: { percent: t.threshold } } : {}),
        ...(t.filling ? { filling: true } : {}),
      };
      const spec = i === 3 ? { ...drum, diameter: -1 } : drum; // an invalid stored shape now and then
      const tank = store.tanks.add(
        team,
        { code: `T${i}`, site: SITES[i % SITES.length]!, product: t.product, spec, settings },
        'u1',
        NOW - 90 * DAY,
      );
      let time = NOW - t.startDaysAgo * DAY;
      for (const [hours, gal] of t.readings) {
        time += hours * HOUR;
        if (time > NOW) break;
        const reading = { tankId: tank.id, time, kind: 'volume' as const, value: gal, unit: 'gal' };
        store.readings.add(team, { ...reading, rawText: `${gal} gal`, userId: 'u1' }, time);
      }
      for (const [hours, gal] of t.deliveries) {
        const at = NOW - hours * HOUR;
        const delivery = { tankId: tank.id, time: at, volume: gal, unit: 'gal' };
        store.deliveries.add(team, { ...delivery, rawText: `delivered ${gal} gal`, userId: 'u1' }, at);
      }
    });
  });
}

/** The reference: each tank's status on its own, with no stored rate state (every reading replayed). */
function oneByOne(team: string, now: number): TankStatus[] {
  store.db.exec('DELETE FROM rate_cache');
  return store.tanks.list(team).flatMap((t) => {
    const s = tankStatus(store, team, t.id, now);
    return s ? [s] : [];
  });
}

/**
 * The full statuses cut as the digest reads them: `history` to the newest readings (at least as many as the
 * digest looks at), and `deliveries` from the first of those, as tankStatus does for the chart's window.
 */
function cutLike(full: TankStatus[], short: TankStatus[]): TankStatus[] {
  expect(short.length).toBe(full.length);
  return full.map((f, i) => {
    const n = short[i]!.history.length;
    expect(n).toBeGreaterThanOrEqual(Math.min(DIGEST_HISTORY_READINGS, f.history.length));
    if (n >= f.history.length) return f;
    const history = f.history.slice(f.history.length - n);
    const first = history[0]!.time;
    return { ...f, history, deliveries: f.deliveries.filter((d) => d.time >= first) };
  });
}

describe('digestStatuses', () => {
  it('gives the statuses and digest of tankStatus tank by tank, cold and warm, on random teams', () => {
    let n = 0;
    fc.assert(
      fc.property(
        fc.array(tankArb, { minLength: 0, maxLength: 5 }),
        fc.constantFrom('America/Chicago', 'Europe/Berlin', 'Australia/Sydney', 'UTC'),
        fc.integer({ min: 0, max: 2 * DAY }),
        (tanks, zone, later) => {
          const team = `console:kestrel-${n++}`;
          seedTeam(team, zone, tanks);
          const now = NOW + later;
          const expected = oneByOne(team, now);
          store.db.exec('DELETE FROM rate_cache');
          const cold = digestStatuses(store, team, now);
          const warm = digestStatuses(store, team, now);
          expect(cold).toEqual(cutLike(expected, cold));
          expect(warm).toEqual(cutLike(expected, warm));
          const digest = (statuses: TankStatus[]) =>
            composeDigest({
              teamName: 'Kestrel',
              timeZone: zone,
              demo: false,
              now,
              since: now - DAY,
              statuses,
            });
          expect(digest(cold)).toEqual(digest(expected));
          expect(digest(warm)).toEqual(digest(expected));
        },
      ),
      { numRuns: 40 },
    );
  });

  it('stays tankStatus with held, deleted and unconvertible readings, and readings after the kept rate state', () => {
    let n = 0;
    fc.assert(
      fc.property(
        fc.array(tankArb, { maxLength: 4 }),
        // Readings to hold or soft-delete, by index into the team's readings.
        fc.array(fc.tuple(fc.nat(), fc.constantFrom('hold', 'delete')), { maxLength: 6 }),
        // Later level readings [tank index, hours after NOW, inches] (the drum is 72 in: some cannot be held).
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 47 }), fc.integer({ min: 0, max: 90 })), {
          maxLength: 5,
        }),
        // Later deliveries [tank index, hours after NOW, gallons], some after every reading.
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 47 }), fc.integer({ min: 1, max: 300 })), {
          maxLength: 3,
        }),
        (tanks, changes, laterReadings, laterDeliveries) => {
          const team = `console:kestrel-edge-${n++}`;
          seedTeam(team, 'America/Chicago', tanks);
          const ids = store.readings.newest(team, 1000).map((r) => r.id);
          for (const [k, what] of changes) {
            const id = ids[k % Math.max(1, ids.length)];
            if (id === undefined) break;
            if (what === 'hold') store.readings.setStatus(team, id, 'held');
            else store.readings.softDelete(team, id, NOW);
          }
          store.db.exec('DELETE FROM rate_cache');
          digestStatuses(store, team, NOW); // keeps each tank's rate state as of its newest reading
          const tankIds = store.tanks.list(team).map((t) => t.id);
          if (tankIds.length > 0) {
            for (const [k, hours, inches] of laterReadings) {
              const reading = { tankId: tankIds[k % tankIds.length]!, time: NOW + hours * HOUR };
              const raw = { kind: 'level' as const, value: inches, unit: 'in', rawText: `${inches} in` };
              store.readings.add(team, { ...reading, ...raw, userId: 'u1' }, reading.time);
            }
            for (const [k, hours, gal] of laterDeliveries) {
              const delivery = { tankId: tankIds[k % tankIds.length]!, time: NOW + hours * HOUR };
              const raw = { volume: gal, unit: 'gal', rawText: `delivered ${gal} gal` };
              store.deliveries.add(team, { ...delivery, ...raw, userId: 'u1' }, delivery.time);
            }
          }
          const now = NOW + 2 * DAY;
          const warm = digestStatuses(store, team, now);
          const expected = oneByOne(team, now);
          expect(warm).toEqual(cutLike(expected, warm));
        },
      ),
      { numRuns: 30 },
    );
  });

  it('keeps the rate state it builds (one commit for the team) and nothing else changes in the store', () => {
    seedTeam('console:kestrel', 'America/Chicago', [
      {
        product: 'diesel',
        threshold: 25,
        leadTimeDays: 2,
        businessDays: false,
        filling: false,
        readings: Array.from({ length: 10 }, (_, i) => [24, 500 - 20 * i] as [number, number]),
        deliveries: [],
        startDaysAgo: 12,
      },
    ]);
    const count = (table: string) =>
      (store.db.prepare(`SELECT count(*) AS n FROM ${table}`).get() as { n: number }).n;
    const before = { readings: count('readings'), deliveries: count('deliveries'), tanks: count('tanks') };
    store.db.exec('DELETE FROM rate_cache');
    digestStatuses(store, 'console:kestrel', NOW);
    expect(count('rate_cache')).toBe(1);
    expect({ readings: count('readings'), deliveries: count('deliveries'), tanks: count('tanks') }).toEqual(
      before,
    );
    expect(digestStatuses(store, 'console:unknown-team', NOW)).toEqual([]);
  });

  it('builds rate states while another connection to the store reads, and leaves its data as it was', () => {
    seedTeam('console:kestrel', 'Europe/Berlin', [
      {
        product: 'potable water',
        threshold: 30,
        leadTimeDays: 1,
        businessDays: true,
        filling: false,
        readings: Array.from({ length: 8 }, (_, i) => [24, 400 - 15 * i] as [number, number]),
        deliveries: [[30, 100]],
        startDaysAgo: 9,
      },
    ]);
    const other = temp.open();
    const expected = oneByOne('console:kestrel', NOW);
    store.db.exec('DELETE FROM rate_cache');
    other.db.exec('BEGIN');
    const seen = other.readings.newest('console:kestrel', 100).length;
    const statuses = digestStatuses(store, 'console:kestrel', NOW);
    // The reader keeps its snapshot; the digest's rate state is stored for the next morning.
    expect(other.readings.newest('console:kestrel', 100).length).toBe(seen);
    other.db.exec('COMMIT');
    expect(statuses).toEqual(cutLike(expected, statuses));
    expect(other.rateCache.get('console:kestrel', statuses[0]!.tank.id)).toBeDefined();
  });

  it('still answers from the kept rate states while another process holds the write lock too long', () => {
    seedTeam('console:kestrel', 'Australia/Sydney', [
      {
        product: 'diesel',
        threshold: 20,
        leadTimeDays: 3,
        businessDays: false,
        filling: false,
        readings: Array.from({ length: 6 }, (_, i) => [24, 450 - 25 * i] as [number, number]),
        deliveries: [],
        startDaysAgo: 7,
      },
    ]);
    const expected = digestStatuses(store, 'console:kestrel', NOW); // builds and keeps the rate state
    const other = temp.open();
    store.db.pragma('busy_timeout = 0');
    other.db.exec('BEGIN IMMEDIATE');
    try {
      expect(digestStatuses(store, 'console:kestrel', NOW + 60_000)).toEqual(
        digestStatuses(other, 'console:kestrel', NOW + 60_000),
      );
      expect(expected.length).toBe(1);
    } finally {
      other.db.exec('ROLLBACK');
    }
  });
});
