/**
 * "What to order today", per site: the tanks whose order is due today, and the tanks of the same product at
 * the same site whose order falls due within a few days after, go on one delivery (engine/refill
 * `consolidateSite`). Only groups that must be ordered today are listed.
 *
 * tankStatus gives plan volumes in the tank's display unit but keeps `plan.sizing` in litres, so the plans are
 * put back in litres before consolidation and the result is shown in each tank's own unit.
 */
import { consolidateSite, type SitePlan } from '../../engine/refill/index.js';
import { mapPlanVolumes, type RefillPlan } from '../../engine/refill/planRefill.js';
import { fromLitres, isVolumeUnit, toLitres, type VolumeUnit } from '../../engine/units/index.js';
import { gaugeFirstNote } from '../replies/cautions.js';
import { formatVolume } from '../replies/format.js';
import type { TankStatus } from '../tank-status.js';

/** Tanks whose order-by falls this many days after the earliest one share its delivery (our choice). */
export const SHARED_DELIVERY_WINDOW_DAYS = 3;
const DAY_MS = 86_400_000;

function inLitres(plan: RefillPlan, unit: VolumeUnit, now: number): RefillPlan {
  const litres = mapPlanVolumes(plan, (v) => toLitres(v, unit));
  // An order already overdue is placed now: grouping by a past order-by would split tanks that all go
  // on today's delivery.
  litres.orderBy = plan.orderBy === null ? null : Math.max(plan.orderBy, now);
  return litres;
}

/**
 * One line per shared delivery due today, largest first:
 * "Ridge Pump Station, diesel: 749 gal (GEN1 378 gal, GEN2 371 gal)"; a single tank reads
 * "North Yard, potable water: W1 200 gal".
 */
export function orderLines(statuses: readonly TankStatus[], now: number, endOfDay: number): string[] {
  return siteOrders(statuses, now, endOfDay).lines;
}

/**
 * The order lines, and the note that goes once beside them when any gives a quantity: "gauge the tank before
 * filling, ..." as the answers say it (a pick-up's wording for pick-ups).
 */
export function siteOrders(
  statuses: readonly TankStatus[],
  now: number,
  endOfDay: number,
): { lines: string[]; note: string | undefined } {
  const byId = new Map<string, TankStatus>();
  const plans: SitePlan[] = [];
  // Only groups whose earliest order falls due today are listed, and a group spans the window after its
  // earliest: a tank due later than that joins none of them, so it is not consolidated at all.
  const latestJoining = endOfDay + SHARED_DELIVERY_WINDOW_DAYS * DAY_MS;
  for (const s of statuses) {
    const unit = s.volumeUnit;
    const orderBy = s.refill?.orderBy;
    if (!s.refill || orderBy === null || orderBy === undefined || orderBy > latestJoining) continue;
    if (!isVolumeUnit(unit)) continue;
    const tankId = String(s.tank.id);
    byId.set(tankId, s);
    plans.push({
      tankId,
      site: s.tank.site ?? 'no site',
      product: s.tank.product ?? 'product not set',
      plan: inLitres(s.refill, unit, now),
    });
  }
  const lines: { litres: number; text: string }[] = [];
  const modes = new Set<'order' | 'pick-up'>();
  for (const order of consolidateSite(plans, SHARED_DELIVERY_WINDOW_DAYS)) {
    if (order.verdict !== 'order-now' && order.orderBy > endOfDay) continue;
    const members = order.tanks.map((line) => ({ line, status: byId.get(line.tankId)! }));
    const unit = members[0]!.status.volumeUnit as VolumeUnit;
    const each = members.map(({ line, status }) => {
      const q = line.quantity;
      const amount =
        q === null
          ? 'quantity unknown'
          : formatVolume(fromLitres(q, status.volumeUnit as VolumeUnit), status.volumeUnit);
      return `${status.tank.code} ${amount}`;
    });
    const head = `${order.site}, ${order.product}${order.mode === 'pick-up' ? ' (pick-up)' : ''}`;
    const total = order.totalQuantity;
    const below = order.belowMinimum
      ? `, below the ${formatVolume(fromLitres(order.minimumOrder, unit), unit)} minimum`
      : '';
    const text =
      members.length === 1
        ? `${head}: ${each[0]}${below}`
        : `${head}: ${total === null ? 'total unknown' : formatVolume(fromLitres(total, unit), unit)} (${each.join(', ')})${below}`;
    lines.push({ litres: total ?? 0, text });
    if (order.tanks.some((line) => line.quantity !== null))
      modes.add(order.mode === 'pick-up' ? 'pick-up' : 'order');
  }
  const sorted = lines.sort((a, b) => b.litres - a.litres || a.text.localeCompare(b.text));
  const notes = (['order', 'pick-up'] as const).filter((m) => modes.has(m)).map((m) => gaugeFirstNote(m));
  return { lines: sorted.map((l) => l.text), note: notes.length ? notes.join('; ') : undefined };
}
