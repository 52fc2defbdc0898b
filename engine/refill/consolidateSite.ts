// One delivery for several tanks of the same product at one site: tanks whose order-by dates fall within a
// window of the earliest one share its order and delivery, each sized for that earlier arrival.
import { orderQuantity } from './orderQuantity.js';
import type { RefillPlan } from './planRefill.js';

const DAY_MS = 86_400_000;

export interface SitePlan {
  tankId: string;
  product: string;
  site: string;
  plan: RefillPlan;
}

export interface SiteOrderLine {
  tankId: string;
  /** Litres for this tank on the shared delivery (null when its capacity is unknown). */
  quantity: number | null;
  expectedVolumeOnArrival: number;
  /** The tank's own latest order time, had it been ordered alone. */
  ownOrderBy: number;
}

export interface SiteOrder {
  site: string;
  product: string;
  mode: RefillPlan['mode'];
  verdict: RefillPlan['verdict'];
  /** The earliest order-by and delivery-by among the tanks: the shared order must meet them all. */
  orderBy: number;
  deliveryBy: number;
  tanks: SiteOrderLine[];
  /** Sum of the lines; null when any line is unknown. */
  totalQuantity: number | null;
  /** The largest minimum order among the tanks, which the shared delivery must reach. */
  minimumOrder: number;
  belowMinimum: boolean;
}

/** Groups plans (same site, product and mode) whose order-by dates lie within `windowDays` of the group's
 * earliest; a tank with no order-by (not being used up) is left out. Sorted by order-by. */
export function consolidateSite(plans: readonly SitePlan[], windowDays: number): SiteOrder[] {
  const window = Math.max(0, Number.isFinite(windowDays) ? windowDays : 0) * DAY_MS;
  const dated = plans
    .filter((p) => p.plan.orderBy !== null)
    .sort((a, b) => (a.plan.orderBy ?? 0) - (b.plan.orderBy ?? 0));
  const groups = new Map<string, SitePlan[][]>();
  for (const entry of dated) {
    const key = JSON.stringify([entry.site, entry.product, entry.plan.mode]);
    const runs = groups.get(key) ?? [];
    const open = runs[runs.length - 1];
    const first = open?.[0]?.plan.orderBy;
    if (open && first != null && (entry.plan.orderBy ?? 0) - first <= window) open.push(entry);
    else runs.push([entry]);
    groups.set(key, runs);
  }
  return [...groups.values()]
    .flat()
    .map(toSiteOrder)
    .sort((a, b) => a.orderBy - b.orderBy);
}

function toSiteOrder(members: SitePlan[]): SiteOrder {
  const head = members[0]!;
  const orderBy = Math.min(...members.map((m) => m.plan.orderBy ?? Number.POSITIVE_INFINITY));
  const deliveryBy = Math.min(...members.map((m) => m.plan.deliveryBy ?? Number.POSITIVE_INFINITY));
  const arrivalAt = Math.min(...members.map((m) => m.plan.sizing.arrivalAt));
  const tanks = members.map((m) => lineAt(m, arrivalAt));
  const known = tanks.every((t) => t.quantity !== null);
  const totalQuantity = known ? tanks.reduce((sum, t) => sum + (t.quantity ?? 0), 0) : null;
  const minimumOrder = Math.max(...members.map((m) => m.plan.sizing.minimumOrder));
  const late = members.some((m) => m.plan.verdict === 'order-now');
  return {
    site: head.site,
    product: head.product,
    mode: head.plan.mode,
    verdict: late ? 'order-now' : head.plan.verdict,
    orderBy,
    deliveryBy,
    tanks,
    totalQuantity,
    minimumOrder,
    belowMinimum: totalQuantity !== null && totalQuantity < minimumOrder,
  };
}

/** A tank's share when the shared delivery comes at `arrivalAt` (no later than its own). */
function lineAt({ tankId, plan }: SitePlan, arrivalAt: number): SiteOrderLine {
  const { sizing } = plan;
  const days = (sizing.arrivalAt - arrivalAt) / DAY_MS;
  // Earlier arrival: an emptying tank still holds more (less room), a filling one holds less to take.
  const volume = Math.max(0, plan.expectedVolumeOnArrival + sizing.ratePerDay * days);
  const capped =
    plan.safeFillVolume === null || plan.mode === 'pick-up' ? volume : Math.min(volume, plan.safeFillVolume);
  // Sized like the tank's own plan: to the safe fill level from the expected volume (a pick-up: all of it).
  const room =
    plan.mode === 'pick-up' ? volume : plan.safeFillVolume === null ? null : plan.safeFillVolume - capped;
  const quantity = room === null ? null : orderQuantity(room, 0, sizing.orderIncrement).quantity;
  return { tankId, quantity, expectedVolumeOnArrival: capped, ownOrderBy: plan.orderBy ?? arrivalAt };
}
