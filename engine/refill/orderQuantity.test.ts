import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { orderQuantity } from './orderQuantity.js';

describe('orderQuantity', () => {
  it('rounds the room down to whole increments', () => {
    expect(orderQuantity(1234, 100, 250)).toEqual({ quantity: 1000, room: 1234, issue: null });
    expect(orderQuantity(0.3, 0, 0.1).quantity).toBeCloseTo(0.3, 12);
    expect(orderQuantity(812.5, 0, 0)).toEqual({ quantity: 812.5, room: 812.5, issue: null });
  });

  it('raises to the minimum order when the minimum still fits', () => {
    // room for 180: increments of 50 give 150, below the minimum of 170, which still fits
    expect(orderQuantity(180, 170, 50)).toEqual({ quantity: 170, room: 180, issue: null });
  });

  it('says so rather than overfill when the minimum does not fit', () => {
    expect(orderQuantity(120, 200, 50)).toEqual({ quantity: 0, room: 120, issue: 'minimum-above-room' });
    expect(orderQuantity(30, 0, 50)).toEqual({ quantity: 0, room: 30, issue: 'no-room' });
    expect(orderQuantity(-10, 0, 0)).toEqual({ quantity: 0, room: 0, issue: 'no-room' });
  });

  it('never orders more than fits, and never less than the minimum unless it orders nothing (a law)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -100, max: 1e6, noNaN: true }),
        fc.double({ min: 0, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 1e4, noNaN: true }),
        (room, minimum, increment) => {
          const { quantity } = orderQuantity(room, minimum, increment);
          expect(quantity).toBeLessThanOrEqual(Math.max(0, room));
          expect(quantity === 0 || quantity >= minimum).toBe(true);
        },
      ),
    );
  });
});
