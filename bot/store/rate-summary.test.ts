import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import { digestStatuses } from '../schedule/digest-statuses.js';
import { tankStatus } from '../tank-status.js';
import type { Store } from './open-store.js';
import { RECENT_KEPT } from './rate-cache.js';

// The rate-cache summary (the newest readings and events kept beside the estimator's state) must never speak
// for readings that changed since it was written: after an undo (soft delete), a restore, a unit fix, a
// held reading or one inserted back in time, the row is gone or rebuilt, and what the digest says is what
// a status from scratch says. Invented demo data (Kestrel Valley Water Co-op).
const DAY = 86_400_000;
const HOUR = 3_600_000;
const NOW = Date.parse('2026-12-02T13:00:00Z');
const TEAM = 'console:kestrel';
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
});
afterEach(() => temp.cleanup());

type Edit =
  | { kind: 'add'; hours: number; gal: number }
  | { kind: 'undo' | 'restore' | 'hold' | 'confirm' | 'cm'; pick: number }
  | { kind: 'digest' };

const editArb: fc.Arbitrary<Edit> = fc.oneof(
  {
    weight: 4,
    arbitrary: fc.record({
      kind: fc.constant('add' as const),
      // Back in time as well as after the newest reading.
      hours: fc.integer({ min: -400, max: 48 }),
      gal: fc.integer({ min: 0, max: 600 }),
    }),
  },
  {
    weight: 3,
    arbitrary: fc.record({
      kind: fc.constantFrom(
        'undo' as const,
        'restore' as const,
        'hold' as const,
        'confirm' as const,
        'cm' as const,
      ),
      pick: fc.nat(),
    }),
  },
  { weight: 3, arbitrary: fc.constant({ kind: 'digest' as const }) },
);

/** What the store says a summary must hold, read now: the newest readings at or before its instant. */
function expectedSummary(tankId: number, asOf: number) {
  const rows = store.readings
    .forTank(TEAM, tankId)
    .filter((r) => r.time <= asOf)
    .sort((a, b) => b.time - a.time || b.id - a.id);
  return {
    recent: rows
      .slice(0, RECENT_KEPT)
      .map(({ id, time, kind, value, unit }) => ({ id, time, kind, value, unit })),
    latest: rows[0] ?? null,
  };
}

describe('rate-cache summary', () => {
  it('is never stale: after undo, restore, unit fix, hold or a reading back in time it is dropped or rebuilt', () => {
    fc.assert(
      fc.property(fc.array(editArb, { minLength: 1, maxLength: 30 }), (edits) => {
        store.db.exec('DELETE FROM rate_cache; DELETE FROM readings; DELETE FROM tanks; DELETE FROM teams');
        store.teams.ensure(TEAM, NOW - 90 * DAY, { name: 'Kestrel Valley Water Co-op', timeZone: 'UTC' });
        const tank = store.tanks.add(
          TEAM,
          { code: 'T1', site: 'North Yard', spec: drum, settings: {} },
          'u1',
          0,
        );
        for (let i = 0; i < 20; i++) {
          const time = NOW - (20 - i) * DAY;
          const gal = 500 - 12 * i;
          const reading = { tankId: tank.id, time, kind: 'volume' as const, value: gal, unit: 'gal' };
          store.readings.add(TEAM, { ...reading, rawText: `${gal} gal`, userId: 'u1' }, time);
        }
        let now = NOW;
        for (const edit of edits) {
          const ids = store.readings.newest(TEAM, 1000, tank.id).map((r) => r.id);
          const deleted = store.db
            .prepare('SELECT id FROM readings WHERE deleted_at IS NOT NULL ORDER BY id')
            .pluck(true)
            .all() as number[];
          if (edit.kind === 'add') {
            const time = now + edit.hours * HOUR;
            const reading = { tankId: tank.id, time, kind: 'volume' as const, value: edit.gal, unit: 'gal' };
            store.readings.add(TEAM, { ...reading, rawText: `${edit.gal} gal`, userId: 'u1' }, time);
            now = Math.max(now, time);
          } else if (edit.kind === 'digest') {
            digestStatuses(store, TEAM, now);
          } else if (edit.kind === 'restore') {
            const id = deleted[edit.pick % Math.max(1, deleted.length)];
            if (id !== undefined) store.readings.restore(TEAM, id);
          } else {
            const id = ids[edit.pick % Math.max(1, ids.length)];
            if (id === undefined) continue;
            if (edit.kind === 'undo') store.readings.softDelete(TEAM, id, now);
            else if (edit.kind === 'hold') store.readings.setStatus(TEAM, id, 'held');
            else if (edit.kind === 'confirm') store.readings.setStatus(TEAM, id, 'ok');
            else store.readings.correctUnit(TEAM, id, 'level', 'cm');
          }
          // Whatever row is kept speaks for the store as it is now.
          const kept = store.rateCache.get(TEAM, tank.id);
          if (kept) {
            const { recent, latest } = expectedSummary(tank.id, kept.asOfTime);
            expect(kept.summary.recent).toEqual(recent);
            expect(kept.summary.latest).toEqual(latest);
          }
        }
        const fast = digestStatuses(store, TEAM, now + HOUR);
        store.db.exec('DELETE FROM rate_cache');
        const scratch = tankStatus(store, TEAM, tank.id, now + HOUR);
        expect(fast[0]?.latest).toEqual(scratch?.latest);
        expect(fast[0]?.rate).toEqual(scratch?.rate);
        expect(fast[0]?.runway).toEqual(scratch?.runway);
        expect(fast[0]?.refill).toEqual(scratch?.refill);
        expect(fast[0]?.events).toEqual(scratch?.events);
        expect(fast[0]?.history).toEqual(scratch?.history.slice(-fast[0]!.history.length));
      }),
      { numRuns: 60 },
    );
  });

  it('a damaged or missing summary is no entry: the state is rebuilt from the readings, not trusted', () => {
    store.teams.ensure(TEAM, NOW - 90 * DAY, { name: 'Kestrel Valley Water Co-op', timeZone: 'UTC' });
    const tank = store.tanks.add(TEAM, { code: 'T1', site: 'North Yard', spec: drum, settings: {} }, 'u1', 0);
    for (let i = 0; i < 10; i++) {
      const time = NOW - (10 - i) * DAY;
      const reading = { tankId: tank.id, time, kind: 'volume' as const, value: 400 - 9 * i, unit: 'gal' };
      store.readings.add(TEAM, { ...reading, rawText: `${400 - 9 * i} gal`, userId: 'u1' }, time);
    }
    const expected = digestStatuses(store, TEAM, NOW);
    const damages = [
      "summary = '{'",
      'summary = \'{"version":4,"events":[],"recent":[[1]],"latest":null}\'', // the form before migration 5
      "summary = '[4,[],[1],null]'", // a reading cut short
      'summary = \'[4,[],[],["9 gal","u1","ok",1]]\'', // a newest reading's rest without the reading
      'summary = NULL',
      'points = \'{"latest":null,"trusted":null}\'', // the form before migration 5
    ];
    for (const damage of damages) {
      store.db.exec(`UPDATE rate_cache SET ${damage}`);
      expect(store.rateCache.get(TEAM, tank.id)).toBeUndefined();
      expect(digestStatuses(store, TEAM, NOW)).toEqual(expected);
      // ...and the status kept a whole row again.
      expect(store.rateCache.get(TEAM, tank.id)?.summary.latest?.id).toBe(expected[0]!.latest!.readingId);
    }
    // A damaged state alone: the summary still answers while nothing is new, and a new reading rebuilds.
    store.db.exec(`UPDATE rate_cache SET state = '{'`);
    expect(digestStatuses(store, TEAM, NOW)).toEqual(expected);
    const reading = { tankId: tank.id, time: NOW + HOUR, kind: 'volume' as const, value: 300, unit: 'gal' };
    store.readings.add(TEAM, { ...reading, rawText: '300 gal', userId: 'u1' }, NOW + HOUR);
    const after = digestStatuses(store, TEAM, NOW + 2 * HOUR);
    store.db.exec('DELETE FROM rate_cache');
    const scratch = tankStatus(store, TEAM, tank.id, NOW + 2 * HOUR);
    expect(after[0]!.rate).toEqual(scratch!.rate);
    expect(after[0]!.readingCount).toBe(11);
  });
});
