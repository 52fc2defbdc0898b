import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import { gaugeFirstNote } from '../replies/cautions.js';
import type { Store } from '../store/index.js';
import { tankStatus } from '../tank-status.js';
import { endOfLocalDay } from './digest-sections.js';
import { orderLines, SHARED_DELIVERY_WINDOW_DAYS, siteOrders } from './site-orders.js';

// Demo scenario of our own invention: Kestrel Valley Water Co-op (DEMO DATA).
const DAY = 86_400_000;
const NOW = Date.parse('2026-12-02T13:00:00Z'); // 07:00 America/Chicago
const TEAM = 'console:kestrel';
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };
const tote = {
  units: { length: 'cm', volume: 'L' },
  shape: 'rectangular',
  width: 100,
  length: 120,
  height: 100,
};

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
  store.teams.ensure(TEAM, NOW - 60 * DAY, { timeZone: 'America/Chicago' });
});
afterEach(() => temp.cleanup());

function tankWithUse(
  code: string,
  site: string,
  product: string,
  spec: object,
  start: number,
  perDay: number,
) {
  const id = store.tanks.add(
    TEAM,
    { code, site, product, spec, settings: { threshold: { percent: 30 }, leadTimeDays: 3 } },
    'u1',
    NOW - 60 * DAY,
  ).id;
  const unit = (spec as { units: { volume: string } }).units.volume;
  store.transaction(() => {
    for (let d = 0; d < 14; d++) {
      const time = NOW - (14 - d) * DAY;
      const value = start - perDay * d;
      store.readings.add(
        TEAM,
        { tankId: id, time, kind: 'volume', value, unit, rawText: `${value} ${unit}`, userId: 'u1' },
        time,
      );
    }
  });
  return tankStatus(store, TEAM, id, NOW)!;
}

describe('orderLines', () => {
  it('puts tanks of one product at one site on one delivery when their order-by dates are close', () => {
    const gen1 = tankWithUse('GEN1', 'Ridge Pump Station', 'diesel', drum, 330, 12);
    const gen2 = tankWithUse('GEN2', 'Ridge Pump Station', 'diesel', drum, 320, 11);
    const gen3 = tankWithUse('GEN3', 'Ridge Pump Station', 'diesel', drum, 390, 12);
    const far = tankWithUse('W1', 'North Yard', 'potable water', drum, 520, 2);
    expect(gen1.refill!.verdict).toBe('order-now');
    expect(gen2.refill!.verdict).toBe('order-now');
    expect(far.refill!.verdict).not.toBe('order-now');
    const lines = orderLines([gen1, gen2, gen3, far], NOW, endOfLocalDay(NOW, 'America/Chicago'));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/^Ridge Pump Station, diesel: [\d,]+ gal \(GEN1 [\d,]+ gal, GEN2 [\d,]+ gal/);
    // GEN3 joins when its own order-by is within the window of the earliest (engine/refill consolidateSite),
    // overdue order-by times counting as now. Here all three are due: one delivery.
    const at = (t: number) => Math.max(t, NOW);
    const earliest = Math.min(at(gen1.refill!.orderBy!), at(gen2.refill!.orderBy!));
    expect(at(gen3.refill!.orderBy!) - earliest).toBeLessThanOrEqual(SHARED_DELIVERY_WINDOW_DAYS * DAY);
    expect(lines[0]).toContain('GEN3');
    // The total is the sum of the lines, in gal.
    const total = Number(/diesel: ([\d,]+) gal/.exec(lines[0]!)![1]!.replaceAll(',', ''));
    const parts = [...lines[0]!.matchAll(/GEN\d ([\d,]+) gal/g)].map((m) =>
      Number(m[1]!.replaceAll(',', '')),
    );
    expect(Math.abs(total - parts.reduce((a, b) => a + b, 0))).toBeLessThanOrEqual(parts.length);
  });

  it('shows each tank in its own unit, and nothing when no order is due today', () => {
    const hypo = tankWithUse('HYPO', 'Mill Creek Lift Station', 'sodium hypochlorite', tote, 420, 18);
    expect(hypo.refill!.verdict).toBe('order-now');
    expect(orderLines([hypo], NOW, endOfLocalDay(NOW, 'America/Chicago'))).toEqual([
      `Mill Creek Lift Station, sodium hypochlorite: HYPO ${Math.round(hypo.refill!.quantity!)} L`,
    ]);
    const calm = tankWithUse('W2', 'North Yard', 'potable water', drum, 520, 1);
    expect(orderLines([calm], NOW, endOfLocalDay(NOW, 'America/Chicago'))).toEqual([]);
  });

  it('says once beside the orders to gauge the tank first, as the answers do; nothing to say with no order', () => {
    const gen1 = tankWithUse('GEN1', 'Ridge Pump Station', 'diesel', drum, 330, 12);
    const hypo = tankWithUse('HYPO', 'Mill Creek Lift Station', 'sodium hypochlorite', tote, 420, 18);
    const endOfDay = endOfLocalDay(NOW, 'America/Chicago');
    const due = siteOrders([gen1, hypo], NOW, endOfDay);
    expect(due.lines).toEqual(orderLines([gen1, hypo], NOW, endOfDay));
    expect(due.lines).toHaveLength(2);
    expect(due.note).toBe(gaugeFirstNote('order'));
    const calm = tankWithUse('W2', 'North Yard', 'potable water', drum, 520, 1);
    expect(siteOrders([calm], NOW, endOfDay)).toEqual({ lines: [], note: undefined });
  });
});
