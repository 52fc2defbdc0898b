import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { planRefill, type RefillInput } from './planRefill.js';

const DAY = 86_400_000;
const start = Date.UTC(2026, 0, 1);

// Random tanks and supplier terms around Kestrel Valley Water Co-op sizes (200 L totes to 40 000 L tanks).
const inputs = fc
  .record({
    capacity: fc.double({ min: 200, max: 40_000, noNaN: true }),
    fillFraction: fc.double({ min: 0, max: 1, noNaN: true }),
    rateDaysToEmpty: fc.double({ min: 2, max: 400, noNaN: true }),
    sigmaFraction: fc.double({ min: 0, max: 0.5, noNaN: true }),
    nowOffset: fc.integer({ min: 0, max: 730 * DAY }),
    ageDays: fc.double({ min: 0, max: 20, noNaN: true }),
    filling: fc.boolean(),
    leadTimeDays: fc.integer({ min: 0, max: 15 }),
    businessDays: fc.boolean(),
    orderCutoffHour: fc.constantFrom(9, 12, 15.5, 24),
    deliveryWeekdays: fc.uniqueArray(fc.integer({ min: 1, max: 7 }), { minLength: 1, maxLength: 7 }),
    deliveryHours: fc.constantFrom<[number, number]>([0, 24], [8, 12], [6.5, 17], [13, 24]),
    minimumFraction: fc.double({ min: 0, max: 0.6, noNaN: true }),
    incrementFraction: fc.double({ min: 0, max: 0.3, noNaN: true }),
    thresholdPercent: fc.double({ min: 0, max: 60, noNaN: true }),
    safeFillPercent: fc.double({ min: 70, max: 100, noNaN: true }),
    serviceLevel: fc.double({ min: 0.5, max: 0.999, noNaN: true }),
    timeZone: fc.constantFrom('UTC', 'America/Chicago', 'Europe/Berlin', 'Australia/Sydney'),
  })
  .map((g): RefillInput => {
    const rate = g.capacity / g.rateDaysToEmpty;
    const now = start + g.nowOffset;
    return {
      now,
      lastReadingAt: now - g.ageDays * DAY,
      volume: g.capacity * g.fillFraction,
      rate: g.filling ? -rate : rate,
      rateSigma: rate * g.sigmaFraction,
      capacity: g.capacity,
      filling: g.filling,
      settings: {
        threshold: { percent: g.filling ? 100 - g.thresholdPercent : g.thresholdPercent },
        leadTimeDays: g.leadTimeDays,
        businessDays: g.businessDays,
        orderCutoffHour: g.orderCutoffHour,
        deliveryWeekdays: g.deliveryWeekdays,
        deliveryHours: g.deliveryHours,
        minimumOrder: g.capacity * g.minimumFraction,
        orderIncrement: g.capacity * g.incrementFraction,
        safeFillPercent: g.safeFillPercent,
        serviceLevel: g.serviceLevel,
        timeZone: g.timeZone,
      },
    };
  });

function orderBy(input: RefillInput): number {
  const r = planRefill(input);
  if (!r.ok) throw new Error(r.error);
  return r.value.orderBy ?? Number.POSITIVE_INFINITY;
}

describe('planRefill laws', () => {
  it('a longer lead time never gives a later order-by', () => {
    fc.assert(
      fc.property(inputs, fc.integer({ min: 1, max: 10 }), (input, extra) => {
        const longer = {
          ...input,
          settings: { ...input.settings, leadTimeDays: (input.settings.leadTimeDays ?? 0) + extra },
        };
        expect(orderBy(longer)).toBeLessThanOrEqual(orderBy(input));
      }),
      { numRuns: 150 },
    );
  });

  it('a higher service level never gives a later order-by', () => {
    fc.assert(
      fc.property(inputs, fc.double({ min: 0, max: 0.5, noNaN: true }), (input, step) => {
        const level = input.settings.serviceLevel ?? 0.95;
        const higher = {
          ...input,
          settings: { ...input.settings, serviceLevel: Math.min(0.9999, level + step) },
        };
        expect(orderBy(higher)).toBeLessThanOrEqual(orderBy(input));
      }),
      { numRuns: 150 },
    );
  });

  it('a delivery never exceeds the safe fill level on arrival, and a pick-up never takes more than is there', () => {
    fc.assert(
      fc.property(inputs, (input) => {
        const r = planRefill(input);
        if (!r.ok) throw new Error(r.error);
        const p = r.value;
        const quantity = p.quantity ?? 0;
        const slack = 1e-6 * (input.capacity ?? 1);
        if (p.mode === 'delivery') {
          // A tank already above its safe fill level on arrival gets nothing.
          const room = Math.max(0, (p.safeFillVolume ?? 0) - p.expectedVolumeOnArrival);
          expect(quantity).toBeLessThanOrEqual(room + slack);
        } else {
          expect(quantity).toBeLessThanOrEqual(p.expectedVolumeOnArrival + slack);
        }
        const minimum = input.settings.minimumOrder ?? 0;
        expect(quantity === 0 || quantity >= minimum - slack).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('the verdict agrees with the dates: order-now iff order-by has passed, order-by only within 14 days', () => {
    fc.assert(
      fc.property(inputs, (input) => {
        const r = planRefill(input);
        if (!r.ok) throw new Error(r.error);
        const { verdict, orderBy: by, deliveryBy, thresholdAt } = r.value;
        if (by === null) return expect(verdict).toBe('no-order-needed');
        expect(verdict === 'order-now').toBe(by <= input.now);
        if (verdict === 'order-by') expect(by).toBeLessThanOrEqual(input.now + 14 * DAY);
        expect(by).toBeLessThanOrEqual(deliveryBy ?? Number.NaN);
        expect(deliveryBy ?? 0).toBeLessThanOrEqual(thresholdAt ?? Number.NaN);
      }),
      { numRuns: 200 },
    );
  });
});
