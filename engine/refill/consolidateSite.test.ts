import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { consolidateSite, type SiteOrder, type SitePlan } from './consolidateSite.js';
import { planRefill, type RefillInput, type RefillPlan } from './planRefill.js';

const DAY = 86_400_000;
const now = Date.UTC(2026, 11, 7, 14); // Monday 7 Dec 2026, 08:00 in Chicago

function plan(over: Partial<RefillInput>): RefillPlan {
  const r = planRefill({
    now,
    lastReadingAt: now,
    volume: 3000,
    rate: 100,
    rateSigma: 0,
    capacity: 5000,
    settings: {
      threshold: { volume: 1000 },
      leadTimeDays: 2,
      orderIncrement: 100,
      timeZone: 'America/Chicago',
    },
    ...over,
  });
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

// Kestrel Valley Water Co-op, North Yard: two diesel tanks and a caustic tank; Ridge Pump Station: diesel.
const yardA: SitePlan = { tankId: 'yard-diesel-a', product: 'diesel', site: 'North Yard', plan: plan({}) };
const yardB: SitePlan = {
  tankId: 'yard-diesel-b',
  product: 'diesel',
  site: 'North Yard',
  plan: plan({ volume: 3200 }),
};
const yardLate: SitePlan = {
  tankId: 'yard-diesel-c',
  product: 'diesel',
  site: 'North Yard',
  plan: plan({ volume: 4000 }),
};
const yardCaustic: SitePlan = {
  tankId: 'yard-caustic',
  product: 'caustic soda',
  site: 'North Yard',
  plan: plan({}),
};
const ridge: SitePlan = {
  tankId: 'ridge-diesel',
  product: 'diesel',
  site: 'Ridge Pump Station',
  plan: plan({}),
};

describe('consolidateSite', () => {
  it('joins tanks of one product at one site whose order-by dates are within the window', () => {
    const orders = consolidateSite([yardLate, ridge, yardB, yardCaustic, yardA], 3);
    const yardDiesel = orders.filter((o) => o.site === 'North Yard' && o.product === 'diesel');
    expect(yardDiesel.map((o) => o.tanks.map((t) => t.tankId))).toEqual([
      ['yard-diesel-a', 'yard-diesel-b'],
      ['yard-diesel-c'],
    ]);
    expect(orders.find((o) => o.product === 'caustic soda')?.tanks).toHaveLength(1);
    expect(orders.find((o) => o.site === 'Ridge Pump Station')?.tanks).toHaveLength(1);
    // sorted by order-by
    const times = orders.map((o) => o.orderBy);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
  });

  it('orders by the earliest member and sizes the later tank for that earlier delivery', () => {
    const [shared] = consolidateSite([yardA, yardB], 3);
    expect(shared?.orderBy).toBe(yardA.plan.orderBy);
    expect(shared?.deliveryBy).toBe(yardA.plan.deliveryBy);
    // Tank B would have come 2 days later; on A's delivery day it holds 2 x 100 L more, so 200 L less fits.
    const days = ((yardB.plan.sizing.arrivalAt - yardA.plan.sizing.arrivalAt) / DAY) | 0;
    expect(days).toBe(2);
    const lineB = shared?.tanks.find((t) => t.tankId === 'yard-diesel-b');
    expect(lineB?.quantity).toBe((yardB.plan.quantity ?? 0) - 200);
    for (const line of shared?.tanks ?? []) {
      expect(line.expectedVolumeOnArrival + (line.quantity ?? 0)).toBeLessThanOrEqual(4500);
    }
    expect(shared?.totalQuantity).toBe((shared?.tanks ?? []).reduce((s, t) => s + (t.quantity ?? 0), 0));
  });

  it('flags a shared delivery below the largest minimum order', () => {
    const small = { ...yardA, plan: { ...yardA.plan, sizing: { ...yardA.plan.sizing, minimumOrder: 1e6 } } };
    const [shared] = consolidateSite([small, yardB], 3);
    expect(shared?.belowMinimum).toBe(true);
    expect(shared?.minimumOrder).toBe(1e6);
  });

  it('leaves out tanks with nothing to order, and copes with an empty list or a bad window', () => {
    const idle: SitePlan = { ...yardA, tankId: 'idle', plan: plan({ rate: 0 }) };
    expect(consolidateSite([idle], 3)).toEqual([]);
    expect(consolidateSite([], 3)).toEqual([]);
    expect(consolidateSite([yardA, yardB], Number.NaN).map((o) => o.tanks.length)).toEqual([1, 1]);
  });
});

const tankArb = fc.record({
  volume: fc.double({ min: 1100, max: 4400, noNaN: true }),
  rate: fc.double({ min: -200, max: 300, noNaN: true }),
  site: fc.constantFrom('North Yard', 'Ridge Pump Station', 'Mill Creek Lift Station'),
  product: fc.constantFrom('diesel', 'caustic soda'),
});

const plansOf = (tanks: readonly { volume: number; rate: number; site: string; product: string }[]) =>
  tanks.map(
    (t, i): SitePlan => ({
      tankId: `t${i}`,
      site: t.site,
      product: t.product,
      plan: plan({ volume: t.volume, rate: t.rate, filling: t.rate < 0 }),
    }),
  );

describe('consolidateSite laws', () => {
  it('puts every tank with an order-by in exactly one group of its own site, product and mode, within the window', () => {
    fc.assert(
      fc.property(
        fc.array(tankArb, { maxLength: 25 }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (tanks, windowDays) => {
          const plans = plansOf(tanks);
          const orders = consolidateSite(plans, windowDays);
          const seen = orders.flatMap((o) => o.tanks.map((l) => l.tankId)).sort();
          const dated = plans
            .filter((p) => p.plan.orderBy !== null)
            .map((p) => p.tankId)
            .sort();
          expect(seen).toEqual(dated);
          for (const order of orders) {
            for (const line of order.tanks) {
              const own = plans.find((p) => p.tankId === line.tankId)!;
              expect([own.site, own.product, own.plan.mode]).toEqual([order.site, order.product, order.mode]);
              expect(line.ownOrderBy - order.orderBy).toBeLessThanOrEqual(windowDays * DAY + 1);
              if (order.mode === 'delivery') {
                expect(line.expectedVolumeOnArrival + (line.quantity ?? 0)).toBeLessThanOrEqual(4500 + 1e-6);
              }
            }
          }
        },
      ),
      { numRuns: 100 },
    );
  });

  it('lists the same groups due by a cut-off when tanks due more than the window after it are left out', () => {
    // What bot/schedule/site-orders relies on to consolidate only the tanks that can join an order due today.
    fc.assert(
      fc.property(
        fc.array(tankArb, { maxLength: 12 }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 14, noNaN: true }),
        (tanks, windowDays, cutDays) => {
          const plans = plansOf(tanks);
          const cut = now + cutDays * DAY;
          const due = (orders: SiteOrder[]) =>
            orders.filter((o) => o.verdict === 'order-now' || o.orderBy <= cut);
          const joining = plans.filter(
            (p) => p.plan.orderBy !== null && p.plan.orderBy <= cut + windowDays * DAY,
          );
          expect(due(consolidateSite(joining, windowDays))).toEqual(due(consolidateSite(plans, windowDays)));
        },
      ),
      { numRuns: 200 },
    );
  });
});
