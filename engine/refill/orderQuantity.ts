// How much to order: fill to the safe level (or, for a pick-up, take what is there), in whole increments.

/** Why the quantity is not simply the room rounded down. */
export type QuantityIssue = 'no-room' | 'minimum-above-room' | 'capacity-unknown';

export interface OrderQuantity {
  /** Litres to order (0 when nothing fits; see `issue`). */
  quantity: number;
  /** Litres that fit below the safe fill level on arrival (a pick-up: litres there to take). */
  room: number;
  issue: QuantityIssue | null;
}

/**
 * The room rounded DOWN to the increment (so a whole-tote or compartment order never overfills), raised to
 * the minimum order when the minimum still fits. When even the minimum does not fit, the answer is 0 with
 * the reason, never an order above the safe fill level.
 */
export function orderQuantity(room: number, minimumOrder: number, orderIncrement: number): OrderQuantity {
  if (!(room > 0)) return { quantity: 0, room: Math.max(0, room), issue: 'no-room' };
  // The small allowance keeps 3 x 0.1 from rounding down to 2 increments through binary fractions.
  const rounded = orderIncrement > 0 ? Math.floor(room / orderIncrement + 1e-9) * orderIncrement : room;
  const fitting = Math.min(rounded, room);
  if (fitting >= minimumOrder && fitting > 0) return { quantity: fitting, room, issue: null };
  if (minimumOrder <= room && minimumOrder > 0) return { quantity: minimumOrder, room, issue: null };
  return { quantity: 0, room, issue: minimumOrder > room ? 'minimum-above-room' : 'no-room' };
}
