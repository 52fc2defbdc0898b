/**
 * Which notices a tank can raise, and how far each is from firing (its margin), from `tankStatus`.
 * - 'limit': an emptying tank at or below its threshold (its own, else the planner's default), or a filling
 *   tank at or above it (its own, else its safe fill level). Margin in percent of capacity, re-armed
 *   `bandPercent` points back on the safe side (e.g. after a delivery or a pick-up).
 * What to order today is the digest's job, not a notice's: right after a delivery the rate re-learns and the
 * plan's order-by can swing for a few readings, which would make an "order now" notice chatter.
 */
import { cautionFor, gaugeFirstNote } from '../replies/cautions.js';
import { formatDuration, formatVolume } from '../replies/format.js';
import type { Reply } from '../replies/reply.js';
import { volumeText } from '../shown-volume.js';
import type { TankStatus } from '../tank-status.js';
import { tankLabel } from './digest-sections.js';

export type NoticeRule = 'limit';
export const NOTICE_RULES: readonly NoticeRule[] = ['limit'];

export interface NoticeBands {
  /** Points of capacity back past the limit before the 'limit' rule re-arms. Default 5. */
  bandPercent: number;
}

export const DEFAULT_BANDS: NoticeBands = { bandPercent: 5 };

/** The volume the rules look at: the smoothed volume (noise filtered by the rate engine), else the reading. */
function currentVolume(status: TankStatus): number | undefined {
  return status.rate?.volume ?? status.latest?.volume;
}

function limitVolume(status: TankStatus): number | undefined {
  if (status.threshold !== undefined) return status.threshold;
  if (status.filling) return status.safeFill;
  return status.refill?.thresholdVolume;
}

/** How far the tank is on the safe side of a rule, in points of capacity; NaN when it cannot tell. */
export function marginOf(_rule: NoticeRule, status: TankStatus): number {
  const volume = currentVolume(status);
  const limit = limitVolume(status);
  if (volume === undefined || limit === undefined || !(status.capacity > 0)) return Number.NaN;
  const points = ((volume - limit) / status.capacity) * 100;
  return status.filling ? -points : points;
}

export function bandOf(_rule: NoticeRule, bands: NoticeBands): number {
  return bands.bandPercent;
}

/** The notice a crossing posts: the main number first, what to do, and a caution where the tank can hurt. */
export function noticeReply(_rule: NoticeRule, status: TankStatus): Reply {
  const label = tankLabel(status);
  const where = status.tank.site ? ` at ${status.tank.site}` : '';
  const unit = status.volumeUnit;
  // The volume the answers show: the trusted one while the latest reading is unconfirmed.
  const facts = [{ label: 'Volume', value: volumeText(status) }];
  const r = status.runway;
  if (r?.days !== null && r?.days !== undefined) {
    const range = r.low !== null && r.high !== null ? { low: r.low, high: r.high } : {};
    facts.push({ label: `Runway to ${r.target}`, value: formatDuration({ value: r.days, ...range }) });
  }
  const plan = status.refill;
  if (plan?.quantity !== null && plan?.quantity !== undefined) {
    const mode = plan.mode === 'pick-up' ? 'pick-up' : 'order';
    facts.push({
      label: mode === 'pick-up' ? 'Pick-up' : 'Order',
      // Common practice, as in the answers: the quantity is a forecast, so the tank is gauged first.
      value: `${formatVolume(plan.quantity, unit)}; ${gaugeFirstNote(mode)}`,
    });
  }
  const overfill = status.filling || status.overSafeFill;
  const headline = status.filling
    ? `${label}${where} is at its high level: book a pick-up.`
    : `${label}${where} is at or below its threshold.`;
  const caution = cautionFor(status.tank.product ?? undefined, overfill ? 'overfill' : 'low');
  return {
    kind: 'notice',
    visibility: 'channel',
    headline,
    facts,
    ...(caution ? { caution } : {}),
  };
}
