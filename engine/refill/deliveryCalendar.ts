// When a delivery ordered at a given moment arrives, and the latest order that still arrives in time:
// whole local days in the tank's time zone (luxon handles the zone and daylight-saving days).
import { DateTime } from 'luxon';
import type { RefillSettings } from './settings.js';

export type OrderCalendar = Pick<
  RefillSettings,
  'leadTimeDays' | 'businessDays' | 'orderCutoffHour' | 'deliveryWeekdays' | 'timeZone'
>;

const isWeekend = (day: DateTime) => day.weekday >= 6;
const nextDay = (day: DateTime): DateTime => day.plus({ days: 1 }).startOf('day');

/** The last moment of `day` at which an order still counts as placed that day. */
export function cutoffOn(day: DateTime, calendar: OrderCalendar): DateTime {
  const hour = calendar.orderCutoffHour;
  if (hour >= 24) return day.endOf('day');
  // set() rather than plus(): on a daylight-saving day local noon is not 12 hours after midnight.
  return day.set({ hour: Math.floor(hour), minute: Math.round((hour % 1) * 60), second: 0, millisecond: 0 });
}

/** The local day (its start) on which a delivery ordered at `orderAt` (epoch ms) arrives. */
export function arrivalDay(orderAt: number, calendar: OrderCalendar): DateTime {
  const placed = DateTime.fromMillis(orderAt, { zone: calendar.timeZone });
  let day: DateTime = placed.startOf('day');
  if (placed > cutoffOn(day, calendar)) day = nextDay(day);
  // A supplier counting business days handles a weekend order on Monday.
  if (calendar.businessDays) while (isWeekend(day)) day = nextDay(day);
  const lead = Math.ceil(calendar.leadTimeDays);
  if (calendar.businessDays) {
    for (let left = lead; left > 0; ) {
      day = nextDay(day);
      if (!isWeekend(day)) left--;
    }
  } else {
    day = day.plus({ days: lead }).startOf('day');
  }
  while (!calendar.deliveryWeekdays.includes(day.weekday)) day = nextDay(day);
  return day;
}

export interface LatestOrder {
  /** Latest moment to place the order (epoch ms). */
  orderBy: number;
  /** Start of the local day its delivery arrives. */
  deliveryDay: DateTime;
  /** End of that day: the truck may come at any hour, so the whole day must lie before the deadline. */
  deliveryBy: number;
}

/**
 * The latest order whose whole delivery day lies at or before `deadline` (epoch ms). The arrival day never
 * moves earlier when the order moves later, so scanning order days backward finds the latest one.
 */
export function latestOrderFor(deadline: number, calendar: OrderCalendar): LatestOrder | null {
  const lead = Math.ceil(calendar.leadTimeDays);
  // No delivery comes sooner than `lead` calendar days after its order day, so start the scan there.
  let day = DateTime.fromMillis(deadline, { zone: calendar.timeZone }).startOf('day').minus({ days: lead });
  const maxSteps = 2 * lead + 40; // weekends and a weekly delivery day cost far fewer steps than this
  for (let step = 0; step < maxSteps; step++) {
    const orderBy = cutoffOn(day, calendar).toMillis();
    const deliveryDay = arrivalDay(orderBy, calendar);
    const deliveryBy = deliveryDay.endOf('day').toMillis();
    if (deliveryBy <= deadline) return { orderBy, deliveryDay, deliveryBy };
    day = day.minus({ days: 1 }).startOf('day');
  }
  return null;
}
