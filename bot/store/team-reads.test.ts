import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createRateEstimator } from '../../engine/rate/index.js';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from './open-store.js';
import { storeReads, teamReads } from './team-reads.js';

// Random tanks of our invented demo team (Kestrel Valley Water Co-op): the prefetched reads must answer every
// question exactly as the store's per-tank queries do, whatever `since` and `limit` are asked.
const DAY = 86_400_000;
const NOW = Date.parse('2026-12-02T13:00:00Z');
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };
const TEAM = 'console:kestrel';

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
});
afterEach(() => temp.cleanup());

const rowArb = fc.record({
  tank: fc.nat({ max: 3 }),
  // Few distinct instants, so readings share a time and the order by id matters.
  day: fc.integer({ min: 0, max: 200 }),
  value: fc.integer({ min: 0, max: 600 }),
  fate: fc.constantFrom('ok', 'ok', 'ok', 'held', 'deleted'),
});

const points = { latest: null, trusted: null };
const state = createRateEstimator({ capacity: 2000, filling: false }).toJSON();

describe('teamReads', () => {
  it('answers as the store does, with held, deleted, same-instant rows and a deleted tank', () => {
    let n = 0;
    fc.assert(
      fc.property(
        fc.array(rowArb, { maxLength: 40 }),
        fc.array(fc.record({ tank: fc.nat({ max: 3 }), day: fc.integer({ min: 0, max: 200 }) }), {
          maxLength: 6,
        }),
        // Rate-cache rows: [tank, as-of day] (one with a state that does not parse, one whose summary does not).
        fc.array(fc.tuple(fc.nat({ max: 3 }), fc.integer({ min: 0, max: 200 })), { maxLength: 4 }),
        fc.array(fc.tuple(fc.integer({ min: -1, max: 201 }), fc.integer({ min: 0, max: 15 })), {
          minLength: 1,
          maxLength: 6,
        }),
        // The tanks the caller says it will ask about (the digest: the live ones), or none said.
        fc.option(fc.subarray([0, 1, 2, 3])),
        (rows, deliveries, caches, questions, asked) => {
          const team = `${TEAM}-${n++}`;
          store.teams.ensure(team, NOW - 300 * DAY, { name: 'Kestrel Valley Water Co-op', timeZone: 'UTC' });
          const tanks = [0, 1, 2, 3].map(
            (i) =>
              store.tanks.add(team, { code: `T${i}`, site: 'North Yard', spec: drum, settings: {} }, 'u1', 0)
                .id,
          );
          const at = (day: number) => NOW - 200 * DAY + day * DAY;
          for (const r of rows) {
            const input = { tankId: tanks[r.tank]!, time: at(r.day), kind: 'volume' as const, unit: 'gal' };
            const status = r.fate === 'held' ? ('held' as const) : ('ok' as const);
            const reading = { ...input, value: r.value, rawText: `${r.value} gal`, userId: 'u1', status };
            const added = store.readings.add(team, reading, 0);
            if (r.fate === 'deleted') store.readings.softDelete(team, added.id, 1);
          }
          for (const d of deliveries) {
            const delivery = { tankId: tanks[d.tank]!, time: at(d.day), volume: 100, unit: 'gal' };
            store.deliveries.add(team, { ...delivery, rawText: 'delivered 100 gal', userId: 'u1' }, 0);
          }
          caches.forEach(([tank, day], i) => {
            const put = { asOfTime: at(day), readings: 1, skipped: 0, specKey: 'k', points, state };
            store.rateCache.put(team, tanks[tank]!, put);
            if (i === 0)
              store.db.prepare("UPDATE rate_cache SET state = '{' WHERE tank_id = ?").run(tanks[tank]);
            if (i === 1)
              store.db.prepare("UPDATE rate_cache SET summary = '[' WHERE tank_id = ?").run(tanks[tank]);
          });
          store.tanks.remove(team, tanks[3]!, 1);
          const direct = storeReads(store, team);
          const sinceOf = (id: number) => direct.rateCache(id)?.asOfTime ?? Number.MIN_SAFE_INTEGER;
          const [firstDay] = questions[0]!;
          const askedIds = asked?.map((i) => tanks[i]!);
          const prefetched = teamReads(store, team, 11, () => at(firstDay), askedIds);
          for (const id of tanks) {
            expect(prefetched.rateCache(id)).toEqual(direct.rateCache(id));
            expect(prefetched.latest(id)).toEqual(direct.latest(id));
            expect(prefetched.series(id, sinceOf(id))).toEqual(direct.series(id, sinceOf(id)));
            for (const [day, limit] of questions) {
              expect(prefetched.series(id, at(day))).toEqual(direct.series(id, at(day)));
              expect(prefetched.recentSeries(id, at(day), limit)).toEqual(
                direct.recentSeries(id, at(day), limit),
              );
              expect(prefetched.deliveries(id, at(day))).toEqual(direct.deliveries(id, at(day)));
            }
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});
