// When a delivery ordered at a given moment arrives, and the latest order that still arrives in time.
// Days are local calendar dates in the tank's zone, counted as whole numbers so that stepping over weekends
// and delivery weekdays is plain arithmetic; luxon turns dates into instants and back (zones, DST days).
import { DateTime } from 'luxon';
import { civilDay } from './civilDay.js';
import type { RefillSettings } from './settings.js';

export type OrderCalendar = Pick<
  RefillSettings,
  'leadTimeDays' | 'businessDays' | 'orderCutoffHour' | 'deliveryWeekdays' | 'deliveryHours' | 'timeZone'
>;

const DAY_MS = 86_400_000;

/** A local calendar date as the number of days since 1970-01-01 (the date's own count, in no zone). */
export type CivilDay = number;

/** ISO weekday, 1 = Monday .. 7 = Sunday (1970-01-01 was a Thursday). */
export const weekdayOf = (day: CivilDay): number => ((((day + 3) % 7) + 7) % 7) + 1;
export const isoDateOf = (day: CivilDay): string => new Date(day * DAY_MS).toISOString().slice(0, 10);
const isWeekend = (day: CivilDay) => weekdayOf(day) >= 6;

/** The local date of an instant. */
export function civilDayOf(ms: number, timeZone: string): CivilDay {
  return civilDay(ms, timeZone);
}

/** Instants by zone, then hour of the day, then date (numbers as keys: no key text built per call). */
const instants = new Map<string, Map<number, Map<CivilDay, number>>>();
let instantsKept = 0;

/** The instant of a local wall-clock time (hours, fractions allowed) on a date; a time skipped by a
 * daylight-saving change moves forward, as luxon does. */
export function instantOf(day: CivilDay, hours: number, timeZone: string): number {
  // luxon spends tens of microseconds per zone conversion; plans ask for the same few dates again and again.
  let byHour = instants.get(timeZone);
  let byDay = byHour?.get(hours);
  const known = byDay?.get(day);
  if (known !== undefined) return known;
  if (instantsKept >= 8192) {
    instants.clear();
    instantsKept = 0;
    byHour = undefined;
    byDay = undefined;
  }
  if (!byHour) {
    byHour = new Map();
    instants.set(timeZone, byHour);
  }
  if (!byDay) {
    byDay = new Map();
    byHour.set(hours, byDay);
  }
  const instant = luxonInstantOf(day, hours, timeZone);
  byDay.set(day, instant);
  instantsKept++;
  return instant;
}

function luxonInstantOf(day: CivilDay, hours: number, timeZone: string): number {
  const date = new Date(day * DAY_MS);
  return DateTime.fromObject(
    {
      year: date.getUTCFullYear(),
      month: date.getUTCMonth() + 1,
      day: date.getUTCDate(),
      hour: Math.floor(hours),
      minute: Math.round((hours % 1) * 60),
    },
    { zone: timeZone },
  ).toMillis();
}

/** Start and (exclusive) end of a local date, as instants. */
export const startOfDay = (day: CivilDay, timeZone: string): number => instantOf(day, 0, timeZone);
export const endOfDay = (day: CivilDay, timeZone: string): number => instantOf(day + 1, 0, timeZone) - 1;

/** The first moment a delivery can come on `day` (the opening of the supplier's delivery hours). */
export function deliveryOpens(
  day: CivilDay,
  calendar: Pick<OrderCalendar, 'deliveryHours' | 'timeZone'>,
): number {
  return instantOf(day, calendar.deliveryHours[0], calendar.timeZone);
}

/** The last moment a delivery can come on `day`: its window's closing hour, or the day's last millisecond. */
export function deliveryCloses(
  day: CivilDay,
  calendar: Pick<OrderCalendar, 'deliveryHours' | 'timeZone'>,
): number {
  const closing = calendar.deliveryHours[1];
  return closing >= 24 ? endOfDay(day, calendar.timeZone) : instantOf(day, closing, calendar.timeZone);
}

/** The last moment of `day` at which an order still counts as placed that day. */
export function cutoffOn(day: CivilDay, calendar: OrderCalendar): number {
  return calendar.orderCutoffHour >= 24
    ? endOfDay(day, calendar.timeZone)
    : instantOf(day, calendar.orderCutoffHour, calendar.timeZone);
}

/** The delivery date of an order that counts as placed on `day` (before that day's cut-off). */
export function arrivalFromOrderDay(day: CivilDay, calendar: OrderCalendar): CivilDay {
  let d = day;
  // A supplier counting business days handles a weekend order on Monday.
  if (calendar.businessDays) while (isWeekend(d)) d++;
  const lead = Math.ceil(calendar.leadTimeDays);
  if (calendar.businessDays) {
    for (let left = lead; left > 0; ) {
      d++;
      if (!isWeekend(d)) left--;
    }
  } else {
    d += lead;
  }
  while (!calendar.deliveryWeekdays.includes(weekdayOf(d))) d++;
  return d;
}

/** The local date on which a delivery ordered at `orderAt` (epoch ms) arrives. */
export function arrivalDay(orderAt: number, calendar: OrderCalendar): CivilDay {
  const placed = civilDayOf(orderAt, calendar.timeZone);
  const counted = orderAt > cutoffOn(placed, calendar) ? placed + 1 : placed;
  const day = arrivalFromOrderDay(counted, calendar);
  // With no lead time an order after that day's delivery hours have closed counts from the next day.
  return deliveryCloses(day, calendar) < orderAt ? arrivalFromOrderDay(counted + 1, calendar) : day;
}

export interface LatestOrder {
  /** Latest moment to place the order (epoch ms). */
  orderBy: number;
  /** The local date its delivery arrives. */
  deliveryDay: CivilDay;
  /** The close of that date's delivery hours (the end of the date when the truck may come at any hour): the
   * whole window must lie before the deadline. */
  deliveryBy: number;
}

/**
 * The latest order whose whole delivery window lies at or before `deadline` (epoch ms). The arrival date never
 * moves earlier when the order day moves later, so scanning order days backward finds the latest one.
 */
export function latestOrderFor(deadline: number, calendar: OrderCalendar): LatestOrder | null {
  // The last date whose delivery window closes by the deadline (with a whole-day window, a deadline at
  // 23:59:59.999 still allows its own date).
  const deadlineDay = civilDayOf(deadline, calendar.timeZone);
  const lastDay = deliveryCloses(deadlineDay, calendar) <= deadline ? deadlineDay : deadlineDay - 1;
  const lead = Math.ceil(calendar.leadTimeDays);
  // No delivery comes sooner than `lead` days after its order date, so the scan starts there.
  for (let day = lastDay - lead, step = 0; step < 2 * lead + 40; day--, step++) {
    const deliveryDay = arrivalFromOrderDay(day, calendar);
    if (deliveryDay <= lastDay) {
      const deliveryBy = deliveryCloses(deliveryDay, calendar);
      // With no lead time the order day is the delivery day: the order must also come before the window shuts.
      return { orderBy: Math.min(cutoffOn(day, calendar), deliveryBy), deliveryDay, deliveryBy };
    }
  }
  return null;
}
