// Closed-loop refill simulation over the accuracy scenarios: the tank's own use (the scenario's true flow,
// its deliveries taken out) drives a simulated tank whose deliveries (pick-ups on a filling tank) come from a
// policy, checked once a day; the policy sees readings carrying the scenario's own reading errors (noise,
// spikes, rounding, typos) and the rate estimator's view of them. Deliveries arrive on the day the supplier
// calendar gives, at 10:00, with the quantity ordered.
import { createRateEstimator, type RatePoint } from '../../engine/rate/index.js';
import { arrivalDay, startOfDay } from '../../engine/refill/deliveryCalendar.js';
import { orderQuantity } from '../../engine/refill/orderQuantity.js';
import { forecastOf, planRefill } from '../../engine/refill/planRefill.js';
import type { RefillSettings } from '../../engine/refill/settings.js';
import { DAY_MS, type Scenario } from './scenarios.js';

const GRID_MS = 5 * 60_000;
const HOUR_MS = 3_600_000;
const WARM_UP_DAYS = 7;

/** The supplier terms and limits every simulated tank gets (invented, typical of bulk chemical supply). */
export function simSettings(
  capacity: number,
  filling: boolean,
  terms: Partial<RefillSettings> = {},
): RefillSettings {
  return {
    threshold: { percent: filling ? 85 : 10 },
    leadTimeDays: 2,
    businessDays: true,
    orderCutoffHour: 12,
    deliveryWeekdays: [1, 2, 3, 4, 5],
    deliveryHours: [8, 12],
    minimumOrder: 0.2 * capacity,
    orderIncrement: 0.01 * capacity,
    safeFillPercent: 90,
    serviceLevel: 0.95,
    timeZone: 'UTC',
    ...terms,
  };
}

export interface PolicyView {
  now: number;
  point: RatePoint;
  capacity: number;
  filling: boolean;
  settings: RefillSettings;
}

/** An order (or pick-up booking) to place before the next daily check, or none. */
export interface PolicyOrder {
  orderAt: number;
  quantity: number;
}

export interface Policy {
  name: string;
  decide(view: PolicyView): PolicyOrder | null;
}

/** The planner at a service level: acts on the day its order-by falls (or at once when late). */
export function plannerPolicy(serviceLevel = 0.95): Policy {
  return {
    name: `planner, ${Math.round(serviceLevel * 1000) / 10}% service level`,
    decide({ now, point, capacity, filling, settings }) {
      const plan = planRefill({
        now,
        ...forecastOf(point),
        capacity,
        filling,
        settings: { ...settings, serviceLevel },
      });
      if (!plan.ok || plan.value.orderBy === null || plan.value.orderBy >= now + DAY_MS) return null;
      const quantity = plan.value.quantity ?? 0;
      return quantity > 0 ? { orderAt: Math.max(now, plan.value.orderBy), quantity } : null;
    },
  };
}

/** A fixed rule: order when the tank is below `level` (book a pick-up above 1 - level), filling to the safe
 * level as it stands now (a pick-up takes what is there). */
export function fixedPolicy(level = 0.3): Policy {
  return {
    name: `fixed: order below ${Math.round(level * 100)}%`,
    decide({ now, point, capacity, filling, settings }) {
      const fraction = point.volume / capacity;
      if (filling ? fraction <= 1 - level : fraction >= level) return null;
      const room = filling ? point.volume : (capacity * settings.safeFillPercent) / 100 - point.volume;
      const { quantity } = orderQuantity(room, settings.minimumOrder, settings.orderIncrement);
      return quantity > 0 ? { orderAt: now, quantity } : null;
    },
  };
}

export interface SimOutcome {
  scenario: string;
  family: string;
  filling: boolean;
  days: number;
  deliveries: number;
  /** Delivery cycles (from one arrival, or the start, to the next) in which the threshold was crossed. */
  breaches: number;
  /** Breaches while an order placed at the first check after the last delivery was still on its way: with
   * one order at a time and this lead time, no policy could have done better. */
  breachesOrderedAtOnce: number;
  /** Breaches within 7 days after the use stepped up by more than 20%, or 2 days after a bulk withdrawal:
   * surprises no forecast from past use foresees. */
  breachesAfterSurprise: number;
  /** Breaches with neither excuse: the planner's own misses, to hold against its service level. */
  breachesOther: number;
  cycles: number;
  /** Cycles in which the tank ran dry (or, filling, reached its capacity). */
  dryOuts: number;
  /** True volume just before each arrival, as a fraction of capacity. */
  levelsAtArrival: number[];
  /** When each of those arrivals came (epoch ms). */
  arrivalTimes: number[];
  /** Arrivals that took the tank above its safe fill level. */
  overfills: number;
  /** The largest excess over the safe fill level after an arrival, fraction of capacity. */
  worstOverfill: number;
}

/** The scenario's own flow on its 5-minute grid, deliveries and pick-ups taken out (withdrawals stay: use). */
function naturalFlow(s: Scenario, start: number, steps: number): Float64Array {
  const flow = new Float64Array(steps);
  let previous = s.truth.volumeAt(start);
  for (let i = 1; i < steps; i++) {
    const v = s.truth.volumeAt(start + i * GRID_MS);
    flow[i] = v - previous;
    previous = v;
  }
  for (const e of s.truth.events) {
    if (e.type === 'withdrawal') continue;
    const first = Math.round((e.start - start) / GRID_MS) + 1;
    const count = Math.max(1, Math.round((e.end - e.start) / GRID_MS));
    const signed = e.type === 'delivery' ? e.volume : -e.volume;
    for (let i = first; i < first + count && i < steps; i++) if (i > 0) flow[i]! -= signed / count;
  }
  return flow;
}

export function simulateRefill(s: Scenario, policy: Policy, terms: Partial<RefillSettings> = {}): SimOutcome {
  const start = s.readings[0]?.time ?? 0;
  const end = s.readings[s.readings.length - 1]?.time ?? start;
  const steps = Math.floor((end - start) / GRID_MS) + 1;
  const flow = naturalFlow(s, start, steps);
  const cap = s.capacity;
  const settings = simSettings(cap, s.filling, terms);
  const threshold = (cap * ('percent' in settings.threshold ? settings.threshold.percent : 0)) / 100;
  const safeFill = (cap * settings.safeFillPercent) / 100;
  const estimator = createRateEstimator({ capacity: cap, filling: s.filling });
  const logDeliveries = true;
  const out: SimOutcome = {
    scenario: s.name,
    family: s.family,
    filling: s.filling,
    days: (end - start) / DAY_MS,
    deliveries: 0,
    breaches: 0,
    breachesOrderedAtOnce: 0,
    breachesAfterSurprise: 0,
    breachesOther: 0,
    cycles: 1,
    dryOuts: 0,
    levelsAtArrival: [],
    arrivalTimes: [],
    overfills: 0,
    worstOverfill: 0,
  };
  let volume = s.truth.volumeAt(start);
  let pending: { orderAt: number; arriveAt: number; quantity: number } | null = null;
  let lastArrival = start;
  let breached = false;
  let dry = false;
  let next = 0; // next reading to feed
  // The last point whose reading the estimator trusts: nobody orders on a reading that looks like a typo.
  let point: RatePoint | null = null;
  // The team knows a delivery came even before a reading shows it: the view adds it to the last estimate.
  let arrived: { at: number; quantity: number } | null = null;
  let nextCheck = startOfDay(Math.floor(start / DAY_MS) + WARM_UP_DAYS, 'UTC') + 8 * HOUR_MS;
  for (let i = 0; i < steps; i++) {
    const t = start + i * GRID_MS;
    volume = Math.min(cap, Math.max(0, volume + flow[i]!));
    if (pending && t >= pending.arriveAt) {
      out.levelsAtArrival.push(volume / cap);
      out.arrivalTimes.push(t);
      out.deliveries++;
      volume = s.filling ? volume - Math.min(volume, pending.quantity) : volume + pending.quantity;
      if (!s.filling && volume > safeFill * 1.0001) {
        out.overfills++;
        out.worstOverfill = Math.max(out.worstOverfill, (volume - safeFill) / cap);
      }
      volume = Math.min(cap, volume);
      if (logDeliveries) estimator.addDelivery(t + HOUR_MS, pending.quantity);
      arrived = { at: t, quantity: s.filling ? -pending.quantity : pending.quantity };
      lastArrival = t;
      pending = null;
      out.cycles++;
      breached = false;
      dry = false;
    }
    if (!breached && (s.filling ? volume > threshold : volume < threshold)) {
      breached = true;
      out.breaches++;
      const atOnce =
        pending !== null && pending.orderAt <= Math.max(lastArrival, start + WARM_UP_DAYS * DAY_MS) + HOUR_MS;
      const surprise = afterSurprise(s, t);
      if (atOnce) out.breachesOrderedAtOnce++;
      if (surprise) out.breachesAfterSurprise++;
      if (!atOnce && !surprise) out.breachesOther++;
    }
    if (!dry && (s.filling ? volume >= cap : volume <= 0)) {
      dry = true;
      out.dryOuts++;
    }
    // Readings up to now, carrying the scenario's own reading error onto this tank.
    while (next < s.readings.length && s.readings[next]!.time <= t) {
      const r = s.readings[next++]!;
      const latest = estimator.addReading(
        r.time,
        carryError(r.volume, s.truth.volumeAt(r.time), volume, cap),
      );
      if (latest.suspect === undefined) point = latest;
      // Until a trusted reading after the delivery shows it, the team adds it to the last estimate.
      if (arrived && point && point.time > arrived.at + HOUR_MS) arrived = null;
    }
    // Daily at 08:00, and once more when a delivery has just come (the team logs it and sees the new plan).
    const justArrived = arrived !== null && arrived.at === t;
    if (t >= nextCheck || justArrived) {
      if (t >= nextCheck) nextCheck += DAY_MS;
      if (!pending && point) {
        const view = arrived && arrived.at > point.time ? afterDelivery(point, arrived, cap) : point;
        const order = policy.decide({ now: t, point: view, capacity: cap, filling: s.filling, settings });
        if (order) {
          const day = arrivalDay(order.orderAt, settings);
          const arriveAt = Math.max(startOfDay(day, 'UTC') + 10 * HOUR_MS, order.orderAt + HOUR_MS);
          pending = { orderAt: order.orderAt, arriveAt, quantity: order.quantity };
        }
      }
    }
  }
  return out;
}

/** The last estimate carried to a delivery's arrival, plus what it brought (minus what a pick-up took). */
function afterDelivery(point: RatePoint, arrived: { at: number; quantity: number }, cap: number): RatePoint {
  const projected = point.volume - (point.rate * (arrived.at - point.time)) / DAY_MS;
  return { ...point, time: arrived.at, volume: Math.min(cap, Math.max(0, projected + arrived.quantity)) };
}

function afterSurprise(s: Scenario, t: number): boolean {
  const stepUp = s.truth.changes.some((c) => {
    if (c > t || c < t - 7 * DAY_MS) return false;
    const before = Math.abs(s.truth.rateAt(c - HOUR_MS));
    return Math.abs(s.truth.rateAt(c + HOUR_MS)) > 1.2 * before;
  });
  return (
    stepUp || s.truth.events.some((e) => e.type === 'withdrawal' && e.start <= t && e.start >= t - 2 * DAY_MS)
  );
}

/** This tank's reading with the scenario reading's error: noise as an offset, and a gross slip (a unit mixed
 * up, digits swapped) as a ratio, so it still looks like the slip it was. */
function carryError(reading: number, truth: number, volume: number, cap: number): number {
  const ratio = truth > 0 ? reading / truth : 1;
  const carried =
    Math.abs(ratio - 1) > 0.2 && truth > 0.05 * cap ? volume * ratio : volume + (reading - truth);
  return Math.min(cap, Math.max(0, carried));
}
