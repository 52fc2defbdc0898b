import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { mapPlanVolumes, planRefill, type RefillInput, type RefillPlan } from './planRefill.js';

const zone = 'America/Chicago';
const at = (iso: string) => DateTime.fromISO(iso, { zone }).toMillis();
const local = (ms: number | null) =>
  ms === null ? null : DateTime.fromMillis(ms, { zone }).toFormat('ccc yyyy-MM-dd HH:mm');

// Kestrel Valley Water Co-op, Ridge Pump Station: a 2000 L sodium hypochlorite tank used at 50 L/day.
const ridge: RefillInput = {
  now: at('2026-12-07T08:00'),
  lastReadingAt: at('2026-12-07T08:00'),
  volume: 1200,
  rate: 50,
  rateSigma: 0,
  capacity: 2000,
  settings: {
    threshold: { percent: 20 },
    leadTimeDays: 3,
    businessDays: true,
    orderCutoffHour: 12,
    deliveryWeekdays: [2, 4],
    minimumOrder: 500,
    orderIncrement: 250,
    // At 50% there is no safety stock (z = 0), so the hand arithmetic below is plain; tests of the margin
    // set their own level.
    serviceLevel: 0.5,
    timeZone: zone,
  },
};
const at95 = { ...ridge, settings: { ...ridge.settings, serviceLevel: 0.95 } };

function plan(input: RefillInput): RefillPlan {
  const r = planRefill(input);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

function errorOf(input: RefillInput): string {
  const r = planRefill(input);
  if (r.ok) throw new Error('expected an error');
  return r.error;
}

describe('planRefill', () => {
  it('counts on a delivery before noon on the threshold day itself, and sizes it on the morning volume', () => {
    // The Ridge tank, a supplier who comes Tue-Thu between 08:00 and 12:00, and the last reading at 15:00:
    // 800 L over the threshold at 50 L/day -> Wed 23 Dec 15:00. Wednesday's window closes at noon, before
    // that, so Wednesday is the last delivery day (a whole-day window would need Tuesday), ordered 3 business
    // days before (Mon, Tue, Wed): Fri 18 Dec by noon. Sized on the volume when the window opens, Wed 08:00,
    // 15 days 17 h after the reading: 1200 - 50 x 15.708 = 414.6 L.
    const mornings = {
      ...ridge,
      now: at('2026-12-07T15:00'),
      lastReadingAt: at('2026-12-07T15:00'),
      settings: {
        ...ridge.settings,
        deliveryWeekdays: [2, 3, 4],
        deliveryHours: [8, 12] as [number, number],
      },
    };
    const p = plan(mornings);
    expect(local(p.thresholdAt)).toBe('Wed 2026-12-23 15:00');
    expect(local(p.deliveryBy)).toBe('Wed 2026-12-23 12:00');
    expect(local(p.orderBy)).toBe('Fri 2026-12-18 12:00');
    expect(p.expectedVolumeOnArrival).toBeCloseTo(1200 - 50 * (15 + 17 / 24), 6);
    const wholeDay = plan({ ...mornings, settings: { ...mornings.settings, deliveryHours: [0, 24] } });
    expect(local(wholeDay.deliveryBy)).toBe('Tue 2026-12-22 23:59');
    expect(local(wholeDay.orderBy)).toBe('Thu 2026-12-17 12:00');
  });

  it('plans the order worked out by hand', () => {
    // 1200 L - 400 L threshold (20%) = 800 L at 50 L/day: 16 days -> Wed 23 Dec 08:00. Last Tue/Thu delivery
    // day ending before that: Tue 22 Dec. 3 business days earlier (Fri, Mon, Tue) is Thu 17 Dec, by noon.
    // On arrival (start of Tue 22, 14 2/3 days on) the tank holds 1200 - 733.3 = 466.7 L; the safe fill is
    // 90% (common practice) = 1800 L, room 1333.3 L -> 5 x 250 L = 1250 L.
    const p = plan(ridge);
    expect(p.verdict).toBe('order-by');
    expect(p.mode).toBe('delivery');
    expect(local(p.thresholdAt)).toBe('Wed 2026-12-23 08:00');
    expect(local(p.deliveryBy)).toBe('Tue 2026-12-22 23:59');
    expect(local(p.orderBy)).toBe('Thu 2026-12-17 12:00');
    expect(p.expectedVolumeOnArrival).toBeCloseTo(1200 - 50 * (14 + 16 / 24), 6);
    expect(p.quantity).toBe(1250);
    expect(p.quantityIssue).toBeNull();
    expect(p.thresholdVolume).toBe(400);
    expect(p.safeFillVolume).toBe(1800);
    // No uncertainty: no safety stock, and the reorder point is the threshold plus use from order to delivery
    // (Thu noon to the end of Tue: 5.5 days x 50 L).
    expect(p.safetyStock).toBe(0);
    expect(p.reorderPoint).toBeCloseTo(400 + 50 * 5.5, 3);
  });

  it('brings the threshold and the order forward when the rate is uncertain', () => {
    const sure = plan(at95);
    const unsure = plan({ ...at95, rateSigma: 15 });
    expect(unsure.thresholdAt ?? 0).toBeLessThan(sure.thresholdAt ?? 0);
    expect(unsure.orderBy ?? 0).toBeLessThanOrEqual(sure.orderBy ?? 0);
    expect(unsure.safetyStock).toBeGreaterThan(0);
  });

  it('grows the safety margin with the age of the last reading', () => {
    // Same expected volume now, but one reading is 6 days old: its forecast is less sure.
    const fresh = plan({ ...at95, rateSigma: 10 });
    const old = plan({ ...at95, rateSigma: 10, lastReadingAt: ridge.now - 6 * 86_400_000, volume: 1500 });
    expect(old.thresholdAt ?? 0).toBeLessThan(fresh.thresholdAt ?? 0);
    expect(old.safetyStock).toBeGreaterThan(fresh.safetyStock);
  });

  it('keeps a margin for day-to-day variation even when the rate is known exactly', () => {
    // sigma_1 = USE_CV x rate = 0.2 x 50 = 10 L/day; 95%: k = 1.6449 (unit normal table, from memory).
    // 50 t + 1.6449 x 10 x sqrt(t) = 800 -> sqrt(t) = (-16.449 + sqrt(16.449^2 + 4 x 50 x 800)) / 100.
    const p = plan(at95);
    const u = (-16.449 + Math.sqrt(16.449 ** 2 + 4 * 50 * 800)) / 100;
    expect(((p.thresholdAt ?? 0) - ridge.lastReadingAt) / 86_400_000).toBeCloseTo(u * u, 3);
    expect(p.safetyStock).toBeGreaterThan(0);
  });

  it('sizes the order to the safe fill level from the expected volume on arrival, in whole increments', () => {
    const p = plan({ ...at95, rateSigma: 5 });
    const room = 1800 - p.expectedVolumeOnArrival;
    expect(p.quantity ?? 0).toBeLessThanOrEqual(room);
    expect((p.quantity ?? 0) + 250).toBeGreaterThan(room);
  });

  it('says order now when the latest order time has passed, and sizes the order for the earliest delivery', () => {
    const p = plan({ ...ridge, volume: 500 });
    expect(p.verdict).toBe('order-now');
    expect(p.orderBy ?? 0).toBeLessThanOrEqual(ridge.now);
    // Ordered Mon 7 Dec 08:00 (before noon): Tue, Wed, Thu -> Thu 10 Dec, a delivery day.
    expect(local(p.earliestDelivery)).toBe('Thu 2026-12-10 23:59');
    expect(p.expectedVolumeOnArrival).toBeCloseTo(500 - 50 * (2 + 16 / 24), 6);
  });

  it('says no order needed when the order-by is more than 14 days away, and still gives it', () => {
    const p = plan({ ...ridge, volume: 1900, capacity: 4000 });
    expect(p.verdict).toBe('no-order-needed');
    expect(p.orderBy ?? 0).toBeGreaterThan(ridge.now + 14 * 86_400_000);
  });

  it('has no dates when the tank is not being used', () => {
    const p = plan({ ...ridge, rate: 0, rateSigma: 2 });
    expect(p.verdict).toBe('no-order-needed');
    // a supply tank whose rate is a little negative (noise) is not turned into a pick-up
    expect(plan({ ...ridge, rate: -0.5 }).mode).toBe('delivery');
    expect(plan({ ...ridge, rate: -0.5 }).orderBy).toBeNull();
    expect(p.orderBy).toBeNull();
    expect(p.thresholdAt).toBeNull();
    expect(p.deliveryBy).toBeNull();
  });

  it('keeps a minimum runway as a threshold: the days of use to keep in hand', () => {
    const p = plan({ ...ridge, settings: { ...ridge.settings, threshold: { runwayDays: 5 } } });
    expect(p.thresholdVolume).toBe(250);
    expect(local(p.thresholdAt)).toBe('Sat 2026-12-26 08:00');
  });

  it('says so rather than overfill when the minimum order does not fit', () => {
    const p = plan({
      ...ridge,
      volume: 1700,
      rate: 50,
      settings: { ...ridge.settings, threshold: { volume: 1650 }, minimumOrder: 500 },
    });
    expect(p.quantity).toBe(0);
    expect(p.quantityIssue).toBe('minimum-above-room');
  });

  it('plans a pick-up for a filling tank (the mirror)', () => {
    // Mill Creek Lift Station: a 3000 L waste holding tank filling at 120 L/day, to be emptied before 80%.
    const p = plan({
      ...ridge,
      volume: 900,
      rate: -120,
      filling: true,
      capacity: 3000,
      settings: {
        threshold: { percent: 80 },
        leadTimeDays: 2,
        orderIncrement: 500,
        serviceLevel: 0.5,
        timeZone: zone,
      },
    });
    expect(p.mode).toBe('pick-up');
    // 2400 - 900 = 1500 L of room at 120 L/day: 12.5 days -> Sat 19 Dec 20:00; whole day before: Fri 18 Dec.
    expect(local(p.thresholdAt)).toBe('Sat 2026-12-19 20:00');
    expect(local(p.deliveryBy)).toBe('Fri 2026-12-18 23:59');
    expect(local(p.orderBy)).toBe('Wed 2026-12-16 23:59');
    expect(p.verdict).toBe('order-by');
    // At the start of Fri 18 Dec (10 2/3 days on) it holds 900 + 1280 = 2180 L: take 4 x 500 L.
    expect(p.expectedVolumeOnArrival).toBeCloseTo(2180, 6);
    expect(p.quantity).toBe(2000);
    expect(p.reorderPoint).toBeLessThan(2400);
  });

  it('works without a capacity for a volume threshold, and says the quantity needs one', () => {
    const { capacity: _, ...noCapacity } = ridge;
    const p = plan({ ...noCapacity, settings: { ...ridge.settings, threshold: { volume: 400 } } });
    expect(local(p.orderBy)).toBe('Thu 2026-12-17 12:00');
    expect(p.quantity).toBeNull();
    expect(p.quantityIssue).toBe('capacity-unknown');
    expect(errorOf(noCapacity)).toMatch(/percent threshold needs the tank capacity/);
  });

  it('answers bad input with a sentence, never a throw', () => {
    expect(errorOf({ ...ridge, volume: Number.NaN })).toMatch(/volume is not a number/);
    expect(errorOf({ ...ridge, volume: 2500 })).toMatch(/above the tank's capacity/);
    expect(errorOf({ ...ridge, now: ridge.lastReadingAt - 1 })).toMatch(/before the last reading/);
    expect(errorOf({ ...ridge, capacity: -3 })).toMatch(/capacity/);
    expect(errorOf({ ...ridge, rateSigma: -1 })).toMatch(/uncertainty/);
    expect(errorOf({ ...ridge, settings: { ...ridge.settings, threshold: { volume: 5000 } } })).toMatch(
      /threshold/,
    );
    expect(errorOf({ ...ridge, settings: { threshold: { percent: 20 }, serviceLevel: 95 } })).toMatch(
      /0\.95/,
    );
  });

  it('treats a filtered volume a hair below zero as empty', () => {
    const p = plan({ ...ridge, volume: -0.4 });
    expect(p.verdict).toBe('order-now');
    expect(p.expectedVolumeOnArrival).toBe(0);
  });
});

describe('mapPlanVolumes', () => {
  it('converts every volume and nothing else, and converting back gives the plan again', () => {
    const p = plan(ridge);
    const doubled = mapPlanVolumes(p, (v) => v * 2);
    expect(doubled.expectedVolumeOnArrival).toBe(p.expectedVolumeOnArrival * 2);
    expect(doubled.thresholdVolume).toBe(p.thresholdVolume * 2);
    expect(doubled.orderBy).toBe(p.orderBy);
    expect(doubled.sizing).toEqual(p.sizing);
    expect(mapPlanVolumes(doubled, (v) => v / 2)).toEqual(p);
  });
});
