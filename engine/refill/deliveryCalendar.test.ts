import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import {
  arrivalDay,
  deliveryCloses,
  deliveryOpens,
  isoDateOf,
  latestOrderFor,
  type OrderCalendar,
  weekdayOf,
} from './deliveryCalendar.js';

const chicago = 'America/Chicago';
const at = (iso: string, zone = chicago) => DateTime.fromISO(iso, { zone }).toMillis();
const local = (ms: number, zone = chicago) =>
  DateTime.fromMillis(ms, { zone }).toISO({ suppressMilliseconds: true });
const calendar = (over: Partial<OrderCalendar>): OrderCalendar => ({
  leadTimeDays: 0,
  businessDays: false,
  orderCutoffHour: 24,
  deliveryWeekdays: [1, 2, 3, 4, 5, 6, 7],
  deliveryHours: [0, 24],
  timeZone: chicago,
  ...over,
});

describe('arrivalDay', () => {
  it('counts an order after the cut-off hour from the next day', () => {
    const cal = calendar({ leadTimeDays: 1, orderCutoffHour: 12 });
    // Monday 2026-12-07
    expect(isoDateOf(arrivalDay(at('2026-12-07T11:59'), cal))).toBe('2026-12-08');
    expect(isoDateOf(arrivalDay(at('2026-12-07T12:00'), cal))).toBe('2026-12-08');
    expect(isoDateOf(arrivalDay(at('2026-12-07T12:01'), cal))).toBe('2026-12-09');
  });

  it('skips Saturday and Sunday in business days, and takes a weekend order on Monday', () => {
    const cal = calendar({ leadTimeDays: 3, businessDays: true, orderCutoffHour: 12 });
    // Friday 2026-12-11 before noon: Mon, Tue, Wed -> Wednesday 16th (common practice for "3 business days").
    expect(isoDateOf(arrivalDay(at('2026-12-11T09:00'), cal))).toBe('2026-12-16');
    // Friday after the cut-off and Saturday both count from Monday: Tue, Wed, Thu.
    expect(isoDateOf(arrivalDay(at('2026-12-11T15:00'), cal))).toBe('2026-12-17');
    expect(isoDateOf(arrivalDay(at('2026-12-12T09:00'), cal))).toBe('2026-12-17');
  });

  it('waits for the next allowed delivery weekday', () => {
    const cal = calendar({ leadTimeDays: 1, deliveryWeekdays: [2, 4] });
    // Tuesday order -> Wednesday earliest -> Thursday delivery
    expect(isoDateOf(arrivalDay(at('2026-12-08T10:00'), cal))).toBe('2026-12-10');
    // Thursday order -> Friday earliest -> next Tuesday
    expect(isoDateOf(arrivalDay(at('2026-12-10T10:00'), cal))).toBe('2026-12-15');
  });
});

describe('latestOrderFor', () => {
  it('needs the whole delivery day before the deadline', () => {
    const cal = calendar({});
    const r = latestOrderFor(at('2026-12-09T15:00'), cal);
    expect(r && local(r.deliveryBy)).toBe('2026-12-08T23:59:59.999-06:00');
    expect(r && local(r.orderBy)).toBe('2026-12-08T23:59:59.999-06:00');
  });

  it('moves an order-by that would fall on a weekend back to Friday at the cut-off', () => {
    const cal = calendar({
      leadTimeDays: 2,
      businessDays: true,
      orderCutoffHour: 12,
      deliveryWeekdays: [1, 2, 3, 4, 5],
    });
    // Deadline Wednesday 16th 08:00 -> delivery by Tuesday 15th; Tuesday minus 2 business days is Friday 11th
    // (2 calendar days back would be Sunday).
    const r = latestOrderFor(at('2026-12-16T08:00'), cal);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-12-15');
    expect(r && local(r.orderBy)).toBe('2026-12-11T12:00:00-06:00');
  });

  it('lands on an allowed delivery weekday (Tuesday and Thursday)', () => {
    const cal = calendar({
      leadTimeDays: 3,
      businessDays: true,
      orderCutoffHour: 12,
      deliveryWeekdays: [2, 4],
    });
    // Deadline Monday 21st: the last Tuesday/Thursday before is Thursday 17th; 3 business days before is Monday 14th.
    const r = latestOrderFor(at('2026-12-21T10:00'), cal);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-12-17');
    expect(r && local(r.orderBy)).toBe('2026-12-14T12:00:00-06:00');
  });

  it('keeps the cut-off at local noon across the spring daylight-saving change (2026-03-08, Chicago)', () => {
    const cal = calendar({ leadTimeDays: 1, orderCutoffHour: 12 });
    // US daylight saving time 2026 starts Sunday 8 March at 02:00 local (common knowledge; the zone data in
    // luxon's host ICU agrees): noon is 18:00Z on the 7th and 17:00Z on the 8th.
    const r = latestOrderFor(at('2026-03-10T06:00'), cal);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-03-09');
    expect(new Date(r?.orderBy ?? 0).toISOString()).toBe('2026-03-08T17:00:00.000Z');
    const before = latestOrderFor(at('2026-03-09T06:00'), cal);
    expect(new Date(before?.orderBy ?? 0).toISOString()).toBe('2026-03-07T18:00:00.000Z');
    // The 23-hour day itself: a delivery on the 8th must be in by 05:00Z on the 9th (midnight CDT).
    const onDst = latestOrderFor(at('2026-03-09T05:00Z', 'UTC'), cal);
    expect(isoDateOf(onDst?.deliveryDay ?? 0)).toBe('2026-03-08');
    expect(onDst?.deliveryBy).toBe(at('2026-03-09T04:59:59.999Z', 'UTC'));
  });

  it('handles the autumn change in Europe (2026-10-25, a 25-hour day)', () => {
    const cal = calendar({ leadTimeDays: 0, orderCutoffHour: 9.5, timeZone: 'Europe/Berlin' });
    // Central European Summer Time ends Sunday 25 October 2026: 09:30 local is 08:30Z after the change.
    const r = latestOrderFor(at('2026-10-26T00:00', 'Europe/Berlin'), cal);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-10-25');
    expect(new Date(r?.orderBy ?? 0).toISOString()).toBe('2026-10-25T08:30:00.000Z');
  });

  it('orders by a time whose delivery arrives in time, on an allowed day, and no later one does (a law)', () => {
    const zones = ['UTC', chicago, 'Europe/Berlin', 'Australia/Sydney', 'Asia/Kolkata'];
    fc.assert(
      fc.property(
        fc.integer({ min: at('2026-01-01T00:00Z', 'UTC'), max: at('2028-01-01T00:00Z', 'UTC') }),
        fc.record({
          leadTimeDays: fc.integer({ min: 0, max: 20 }),
          businessDays: fc.boolean(),
          orderCutoffHour: fc.constantFrom(8, 12, 16.5, 24),
          deliveryWeekdays: fc.uniqueArray(fc.integer({ min: 1, max: 7 }), { minLength: 1, maxLength: 7 }),
          deliveryHours: fc.constantFrom<[number, number]>([0, 24], [8, 12], [6.5, 17], [0, 2.5]),
          timeZone: fc.constantFrom(...zones),
        }),
        (deadline, cal) => {
          const r = latestOrderFor(deadline, cal);
          expect(r).not.toBeNull();
          if (!r) return;
          expect(r.deliveryBy).toBeLessThanOrEqual(deadline);
          expect(r.orderBy).toBeLessThanOrEqual(r.deliveryBy);
          expect(cal.deliveryWeekdays).toContain(weekdayOf(r.deliveryDay));
          expect(arrivalDay(r.orderBy, cal)).toBe(r.deliveryDay);
          // one minute later is too late
          expect(deliveryCloses(arrivalDay(r.orderBy + 60_000, cal), cal)).toBeGreaterThan(deadline);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('delivery hours', () => {
  // A supplier who delivers "before noon" (common practice for bulk chemical and fuel drops) can arrive on
  // the very day the tank reaches its threshold, if that is after noon.
  const beforeNoon = calendar({ deliveryHours: [8, 12] });

  it('allows the deadline day itself when its delivery window closes before the deadline', () => {
    const r = latestOrderFor(at('2026-12-09T15:00'), beforeNoon);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-12-09');
    expect(r && local(r.deliveryBy)).toBe('2026-12-09T12:00:00-06:00');
    // a whole-day window needs the day before (the truck may come at any hour)
    expect(isoDateOf(latestOrderFor(at('2026-12-09T15:00'), calendar({}))?.deliveryDay ?? 0)).toBe(
      '2026-12-08',
    );
  });

  it('moves to the day before when the deadline falls inside the window', () => {
    const r = latestOrderFor(at('2026-12-09T11:00'), beforeNoon);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-12-08');
    expect(r && local(r.deliveryBy)).toBe('2026-12-08T12:00:00-06:00');
  });

  it('opens and closes at local hours across the spring change (2026-03-08, Chicago: 02:00-03:00 skipped)', () => {
    const day = Date.UTC(2026, 2, 8) / 86_400_000;
    const cal = calendar({ deliveryHours: [2.5, 12] });
    // 02:30 does not exist that morning: the window opens at the next valid minute, 03:30 CDT (luxon's rule).
    expect(local(deliveryOpens(day, cal))).toBe('2026-03-08T03:30:00-05:00');
    expect(local(deliveryCloses(day, cal))).toBe('2026-03-08T12:00:00-05:00');
  });

  it('a window of the whole day closes at its last millisecond, as before', () => {
    const day = Date.UTC(2026, 11, 9) / 86_400_000;
    expect(local(deliveryCloses(day, calendar({})))).toBe('2026-12-09T23:59:59.999-06:00');
    expect(local(deliveryOpens(day, calendar({})))).toBe('2026-12-09T00:00:00-06:00');
  });
});

describe('civil day arithmetic', () => {
  it('knows the weekday of a date', () => {
    // 1970-01-01 was a Thursday; 2026-12-07 is a Monday (any calendar).
    expect(weekdayOf(0)).toBe(4);
    expect(weekdayOf(Date.UTC(2026, 11, 7) / 86_400_000)).toBe(1);
    expect(weekdayOf(-1)).toBe(3);
    expect(isoDateOf(Date.UTC(2026, 11, 7) / 86_400_000)).toBe('2026-12-07');
  });

  it('allows the deadline day itself when the deadline is its last millisecond', () => {
    const cal = calendar({});
    const r = latestOrderFor(at('2026-12-09T23:59:59.999'), cal);
    expect(isoDateOf(r?.deliveryDay ?? 0)).toBe('2026-12-09');
  });
});
