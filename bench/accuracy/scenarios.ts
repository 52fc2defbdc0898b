// Scenario generator with ground truth for the accuracy bench (and the refill planner's simulation).
// Invented tanks only: the numbers below are a design of test conditions, not measurements.
// A true volume is simulated on a 5-minute grid: use at a regime rate (changing x0.3 to x3.5) shaped by
// working hours and weekdays, deliveries at a reorder point filling to 80-95% (or pick-ups on filling tanks),
// bulk withdrawals; then observed either by a sensor (noise, spikes, gaps, outages, quantisation, a daily
// thermal swing) or by a crew (weekday working-hour dips rounded to the inch or percent, typos, unit slips).
import type { TimedVolume } from '../../engine/rate/index.js';
import { type Random, seededRandom } from './random.js';

export const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;
const GRID_MS = 5 * 60_000;

export type Family = 'dense' | 'manual' | 'filling' | 'hard';
export type TruthEventType = 'delivery' | 'withdrawal' | 'pickup';

export interface TruthEvent {
  type: TruthEventType;
  start: number;
  end: number;
  volume: number;
}

export interface Scenario {
  name: string;
  family: Family;
  capacity: number;
  filling: boolean;
  /** Typical sampling interval, ms. */
  intervalMs: number;
  readings: TimedVolume[];
  /** Deliveries someone logged (pick-ups on filling tanks). */
  logged: TimedVolume[];
  truth: {
    events: TruthEvent[];
    /** Regime rate (litres/day, positive while emptying) at each instant: the steady use to estimate. */
    rateAt(time: number): number;
    /**
     * The regime rate times this calendar day's weekday factor: the mean use over the day (the working-hour
     * shape averages out within a day, the weekend dip does not). What readings of that day can show.
     */
    dayUseAt(time: number): number;
    volumeAt(time: number): number;
    /** Instants where the regime rate changed. */
    changes: number[];
  };
}

export interface ScenarioSpec {
  family: Family;
  days: number;
  capacity: number;
  filling: boolean;
  /** Starting regime rate, litres/day (negative on a filling tank). */
  rate: number;
  /** Regime changes: at day, multiply the rate by factor. */
  changes: { day: number; factor: number }[];
  withdrawalsPerMonth: number;
  /** Share of use in working hours (0 = flat), and weekend use relative to weekdays. */
  workHoursShare: number;
  weekendFactor: number;
  sensor?: {
    intervalMs: number;
    noise: number;
    spikeRate: number;
    thermal: number;
    quantum: number;
    outageDays: number;
  };
  manual?: { perWeek: number; rounding: 'inch' | 'percent'; typoRate: number; loggedShare: number };
  /** Force events: a delivery at a day (hard cases). */
  extraDeliveries?: number[];
  extraWithdrawals?: number[];
}

const START = Date.UTC(2026, 2, 2); // a Monday

function shapeAt(t: number, spec: ScenarioSpec): number {
  const hour = ((t % DAY_MS) / HOUR_MS + 24) % 24;
  const work = hour >= 8 && hour < 17 ? 1 : 0;
  // Mean over a day is 1: share s in 9 working hours, the rest over 15.
  const daily =
    spec.workHoursShare === 0
      ? 1
      : work
        ? (spec.workHoursShare * 24) / 9
        : ((1 - spec.workHoursShare) * 24) / 15;
  return (daily * weekdayFactor(t, spec)) / weekMean(spec);
}

/** Weekends use weekendFactor of a weekday's use. */
function weekdayFactor(t: number, spec: ScenarioSpec): number {
  const weekday = Math.floor((t - START) / DAY_MS) % 7; // 0 = Monday
  return weekday >= 5 ? spec.weekendFactor : 1;
}

const weekMean = (spec: ScenarioSpec) => (5 + 2 * spec.weekendFactor) / 7;

/** Use on this calendar day relative to the weekly mean: the day's mean of shapeAt. */
const dayFactorAt = (t: number, spec: ScenarioSpec) => weekdayFactor(t, spec) / weekMean(spec);

/** Simulates the true volume on a 5-minute grid with events; returns the grid and the truth. */
function simulateTruth(spec: ScenarioSpec, rnd: Random) {
  const n = Math.round((spec.days * DAY_MS) / GRID_MS) + 1;
  const volume = new Float64Array(n);
  const rateGrid = new Float64Array(n);
  const events: TruthEvent[] = [];
  const changes = spec.changes.map((c) => START + c.day * DAY_MS);
  const cap = spec.capacity;
  let v = spec.filling ? rnd.uniform(0.1, 0.3) * cap : rnd.uniform(0.6, 0.9) * cap;
  let regime = spec.rate;
  let active: { type: TruthEventType; end: number; step: number } | null = null;
  let orderedAt: number | null = null;
  const reorder = rnd.uniform(0.2, 0.35) * cap;
  const extraD = new Set((spec.extraDeliveries ?? []).map((d) => Math.round((d * DAY_MS) / GRID_MS)));
  const extraW = new Set((spec.extraWithdrawals ?? []).map((d) => Math.round((d * DAY_MS) / GRID_MS)));
  const withdrawalP = (spec.withdrawalsPerMonth / (30 * DAY_MS)) * GRID_MS;
  const startEvent = (type: TruthEventType, t: number, amount: number, minutes: number) => {
    const steps = Math.max(1, Math.round((minutes * 60_000) / GRID_MS));
    const signed = type === 'delivery' ? amount : -amount;
    events.push({ type, start: t, end: t + steps * GRID_MS, volume: amount });
    active = { type, end: t + steps * GRID_MS, step: signed / steps };
  };
  for (let i = 0; i < n; i++) {
    const t = START + i * GRID_MS;
    for (const c of spec.changes) if (Math.round((c.day * DAY_MS) / GRID_MS) === i) regime *= c.factor;
    rateGrid[i] = regime;
    if (i > 0) v -= (regime * shapeAt(t, spec) * GRID_MS) / DAY_MS;
    if (active) {
      const a: { end: number; step: number } = active;
      v += a.step;
      if (t >= a.end) active = null;
    } else if (!spec.filling) {
      if (orderedAt === null && v < reorder) orderedAt = t + rnd.uniform(0.3, 2) * DAY_MS;
      const due = (orderedAt !== null && t >= orderedAt) || extraD.has(i);
      if (due) {
        const fillTo = rnd.uniform(0.8, 0.95) * cap;
        if (fillTo - v > 0.05 * cap) startEvent('delivery', t, fillTo - v, rnd.uniform(20, 60));
        orderedAt = null;
      } else if ((rnd.chance(withdrawalP) || extraW.has(i)) && v > 0.25 * cap) {
        startEvent('withdrawal', t, rnd.uniform(0.05, 0.15) * cap, rnd.uniform(10, 60));
      }
    } else if (v > rnd.uniform(0.8, 0.9) * cap) {
      startEvent('pickup', t, v - rnd.uniform(0.05, 0.15) * cap, rnd.uniform(30, 60));
    }
    v = Math.min(cap, Math.max(0, v));
    volume[i] = v;
  }
  const index = (time: number) => Math.min(n - 1, Math.max(0, Math.round((time - START) / GRID_MS)));
  return {
    volume,
    events,
    changes,
    rateAt: (time: number) => rateGrid[index(time)]!,
    dayUseAt: (time: number) => rateGrid[index(time)]! * dayFactorAt(time, spec),
    volumeAt: (time: number) => volume[index(time)]!,
    n,
  };
}

function observeSensor(
  spec: ScenarioSpec,
  truth: ReturnType<typeof simulateTruth>,
  rnd: Random,
): TimedVolume[] {
  const s = spec.sensor!;
  const cap = spec.capacity;
  const every = Math.max(1, Math.round(s.intervalMs / GRID_MS));
  const outageStart =
    s.outageDays > 0 ? rnd.uniform(0.3, 0.7) * spec.days * DAY_MS : Number.POSITIVE_INFINITY;
  const phase = rnd.uniform(0, 2 * Math.PI);
  const out: TimedVolume[] = [];
  for (let i = 0; i < truth.n; i += every) {
    const since = i * GRID_MS;
    if (since >= outageStart && since < outageStart + s.outageDays * DAY_MS) continue;
    if (rnd.chance(0.02)) continue; // a missed report
    const t = START + since;
    const thermal = s.thermal * cap * Math.sin((2 * Math.PI * (t % DAY_MS)) / DAY_MS + phase);
    let reading = truth.volume[i]! + thermal + s.noise * cap * rnd.normal();
    if (rnd.chance(s.spikeRate)) reading += rnd.pick([-1, 1]) * rnd.uniform(0.05, 0.3) * cap;
    if (s.quantum > 0) reading = Math.round(reading / (s.quantum * cap)) * s.quantum * cap;
    out.push({ time: t, volume: Math.min(cap, Math.max(0, reading)) });
  }
  return out;
}

function observeManual(
  spec: ScenarioSpec,
  truth: ReturnType<typeof simulateTruth>,
  rnd: Random,
): TimedVolume[] {
  const m = spec.manual!;
  const cap = spec.capacity;
  // A vertical cylinder 2.4 m tall: volume is linear in level, so one inch is 0.0254 / 2.4 of capacity.
  const heightIn = 2.4 / 0.0254;
  const out: TimedVolume[] = [];
  const meanGapDays = 7 / m.perWeek;
  let day = rnd.uniform(0, 1);
  while (day < spec.days) {
    let t = START + Math.floor(day) * DAY_MS + rnd.uniform(7.5, 16.5) * HOUR_MS;
    const weekday = Math.floor((t - START) / DAY_MS) % 7;
    if (weekday >= 5) t += (7 - weekday) * DAY_MS; // crews dip on weekdays
    if (t >= START + spec.days * DAY_MS) break;
    const v = truth.volumeAt(t);
    let reading: number;
    if (m.rounding === 'inch') {
      let inches = Math.round((v / cap) * heightIn);
      if (rnd.chance(m.typoRate)) {
        const swapped = Number(String(inches).split('').reverse().join(''));
        inches = swapped !== inches && swapped <= heightIn ? swapped : Math.round(inches * 2.54); // cm for inches
      }
      reading = (Math.min(inches, heightIn) / heightIn) * cap;
    } else {
      let percent = Math.round((v / cap) * 100);
      if (rnd.chance(m.typoRate))
        percent = Number(String(percent).split('').reverse().join('')) || percent + 10;
      reading = (Math.min(percent, 100) / 100) * cap;
    }
    out.push({ time: Math.round(t / 60_000) * 60_000, volume: reading });
    day =
      Math.floor(day) + Math.max(1, Math.round(meanGapDays * rnd.uniform(0.6, 1.4))) + rnd.uniform(0, 0.2);
  }
  out.sort((a, b) => a.time - b.time);
  return out.filter((r, i) => i === 0 || r.time !== out[i - 1]!.time);
}

export function buildScenario(name: string, spec: ScenarioSpec, seed: number): Scenario {
  const rnd = seededRandom(seed);
  const truth = simulateTruth(spec, rnd);
  const readings = spec.sensor ? observeSensor(spec, truth, rnd) : observeManual(spec, truth, rnd);
  const loggedShare = spec.manual?.loggedShare ?? 0;
  const logged = truth.events
    .filter((e) => e.type === (spec.filling ? 'pickup' : 'delivery') && rnd.chance(loggedShare))
    .map((e) => ({ time: e.end + Math.round(rnd.uniform(0, 2) * HOUR_MS), volume: Math.round(e.volume) }));
  return {
    name,
    family: spec.family,
    capacity: spec.capacity,
    filling: spec.filling,
    intervalMs: spec.sensor ? spec.sensor.intervalMs : (7 / spec.manual!.perWeek) * DAY_MS,
    readings,
    logged,
    truth: {
      events: truth.events,
      rateAt: truth.rateAt,
      dayUseAt: truth.dayUseAt,
      volumeAt: truth.volumeAt,
      changes: truth.changes,
    },
  };
}
