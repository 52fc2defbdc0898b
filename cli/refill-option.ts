// `tankrunway analyze --plan SETTINGS.json [--now ISO]`: the `refill` object of ../shared/docs/cli-contract.md
// section 5, planned from the analysis point at (or just before) `now`.
import { readFile } from 'node:fs/promises';
import { DateTime } from 'luxon';
import type { RatePoint } from '../engine/rate/index.js';
import {
  forecastOf,
  parseRefillSettings,
  planRefill,
  type QuantityIssue,
  type RefillPlan,
  type RefillSettings,
} from '../engine/refill/index.js';
import { fromLitres, toLitres, type VolumeUnit } from '../engine/units/index.js';
import { isoTime } from './commands/analyze.js';
import { UsageError } from './io.js';

export interface RefillOptionArgs {
  plan?: string;
  now?: string;
}

export interface RefillContext {
  volumeUnit: VolumeUnit;
  /** Litres, or null when neither --tank nor --capacity gave one. */
  capacity: number | null;
  /** --filling was given. */
  filling: boolean;
}

export interface RefillJson {
  verdict: RefillPlan['verdict'];
  mode: RefillPlan['mode'];
  orderBy: string | null;
  deliveryBy: string | null;
  thresholdAt: string | null;
  earliestDelivery: string;
  quantity: number | null;
  expectedVolumeOnArrival: number;
  reorderPoint: number;
  safetyStock: number;
  /** Why the quantity is 0 or missing, in words. */
  note?: string;
}

/** The `refill` object, or undefined without --plan. Throws UsageError for what the user must fix. */
export async function refillOption(
  args: RefillOptionArgs,
  context: RefillContext,
  points: readonly RatePoint[],
): Promise<RefillJson | undefined> {
  if (args.plan === undefined) {
    if (args.now !== undefined) throw new UsageError('--now needs --plan SETTINGS.json');
    return undefined;
  }
  const settings = settingsInLitres(await readSettings(args.plan), context.volumeUnit);
  const now = args.now === undefined ? undefined : parseNow(args.now, settings.timeZone);
  const point = pointAt(points, now);
  if (!point) {
    throw new UsageError(
      now === undefined
        ? 'a refill plan needs at least one valid reading'
        : '--now is before the first reading',
    );
  }
  const planned = planRefill({
    now: now ?? point.time,
    ...forecastOf(point),
    ...(context.capacity !== null ? { capacity: context.capacity } : {}),
    // A filling tank: said with --filling, or a rate whose whole ~80% range is below zero.
    filling: context.filling || point.rateHigh < 0,
    settings,
  });
  if (!planned.ok) throw new UsageError(`--plan ${args.plan}: ${planned.error}`);
  return toJson(planned.value, context.volumeUnit);
}

async function readSettings(path: string): Promise<RefillSettings> {
  let raw: unknown;
  try {
    raw = JSON.parse(await readFile(path, 'utf8'));
  } catch (error) {
    throw new UsageError(
      `cannot read the refill settings ${path}: ${error instanceof Error ? error.message : String(error)}`,
    );
  }
  const settings = parseRefillSettings(raw);
  if (!settings.ok) throw new UsageError(`${path}: ${settings.error}`);
  return settings.value;
}

/** The settings' volumes are in the analysis unit; the engine works in litres. */
function settingsInLitres(settings: RefillSettings, unit: VolumeUnit): RefillSettings {
  const litres = (x: number) => toLitres(x, unit);
  const t = settings.threshold;
  return {
    ...settings,
    threshold: 'volume' in t ? { volume: litres(t.volume) } : t,
    minimumOrder: litres(settings.minimumOrder),
    orderIncrement: litres(settings.orderIncrement),
  };
}

/** ISO 8601; without an offset it is read in the settings' time zone. */
function parseNow(text: string, timeZone: string): number {
  const t = DateTime.fromISO(text, { zone: timeZone });
  if (!t.isValid)
    throw new UsageError(`--now "${text}" is not an ISO 8601 time such as 2026-12-09T08:00:00Z`);
  return t.toMillis();
}

/** The last point at or before `now` (all points are causal), or the last point. */
function pointAt(points: readonly RatePoint[], now: number | undefined): RatePoint | undefined {
  if (now === undefined) return points[points.length - 1];
  let found: RatePoint | undefined;
  for (const p of points) if (p.time <= now) found = p;
  return found;
}

const maybeIso = (ms: number | null) => (ms === null ? null : isoTime(Math.round(ms)));

function toJson(plan: RefillPlan, unit: VolumeUnit): RefillJson {
  const out = (litres: number) => Number(fromLitres(litres, unit).toPrecision(10));
  const note = noteFor(plan.quantityIssue, plan, unit);
  return {
    verdict: plan.verdict,
    mode: plan.mode,
    orderBy: maybeIso(plan.orderBy),
    deliveryBy: maybeIso(plan.deliveryBy),
    thresholdAt: maybeIso(plan.thresholdAt),
    earliestDelivery: isoTime(Math.round(plan.earliestDelivery)),
    quantity: plan.quantity === null ? null : out(plan.quantity),
    expectedVolumeOnArrival: out(plan.expectedVolumeOnArrival),
    reorderPoint: out(plan.reorderPoint),
    safetyStock: out(plan.safetyStock),
    ...(note ? { note } : {}),
  };
}

function noteFor(issue: QuantityIssue | null, plan: RefillPlan, unit: VolumeUnit): string | undefined {
  const amount = (litres: number) => `${Number(fromLitres(litres, unit).toPrecision(4))} ${unit}`;
  const room = Math.max(0, (plan.safeFillVolume ?? 0) - plan.expectedVolumeOnArrival);
  switch (issue) {
    case 'capacity-unknown':
      return 'give --tank or --capacity to size the order to the safe fill level';
    case 'minimum-above-room':
      return plan.mode === 'pick-up'
        ? `less than the minimum pick-up is expected on arrival (${amount(plan.expectedVolumeOnArrival)})`
        : `the minimum order would fill above the safe fill level (room for ${amount(room)} on arrival): order nothing yet or agree a smaller drop`;
    case 'no-room':
      return plan.mode === 'pick-up'
        ? 'nothing to pick up on arrival'
        : 'no room below the safe fill level on arrival';
    default:
      return undefined;
  }
}

/** The plan in words for the analyze summary (empty without --plan). */
export function refillSummary(refill: RefillJson | undefined): string {
  if (!refill) return '';
  const what = refill.mode === 'pick-up' ? 'pick-up' : 'order';
  const when =
    refill.verdict === 'order-now'
      ? `${what} now (earliest ${refill.mode === 'pick-up' ? 'pick-up' : 'delivery'} by ${refill.earliestDelivery})`
      : refill.orderBy === null
        ? `no ${what} needed: not ${refill.mode === 'pick-up' ? 'filling' : 'emptying'} toward the threshold`
        : `${refill.verdict === 'order-by' ? `${what} by` : `no ${what} needed before`} ${refill.orderBy} (arrives by ${refill.deliveryBy})`;
  const lines = [`refill: ${when}`];
  if (refill.quantity !== null && refill.quantity > 0) {
    lines.push(
      `  quantity ${refill.quantity}, expected ${refill.expectedVolumeOnArrival} in the tank on arrival`,
    );
  }
  if (refill.note) lines.push(`  ${refill.note}`);
  if (refill.mode === 'delivery') {
    lines.push(
      '  before filling, check the room in the tank on its gauge; local codes and the supplier rule the delivery',
    );
  }
  return `${lines.join('\n')}\n`;
}
