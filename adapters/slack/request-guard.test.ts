import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isFutureTimestamp, maxFutureSkewSeconds } from './request-guard.js';

const now = Date.UTC(2026, 11, 2, 8, 0, 0);
const nowSec = now / 1000;

describe('isFutureTimestamp', () => {
  it('accepts the current second and the tolerance edge', () => {
    expect(isFutureTimestamp(String(nowSec), now)).toBe(false);
    expect(isFutureTimestamp(String(nowSec + maxFutureSkewSeconds), now)).toBe(false);
  });

  it('refuses a timestamp past the tolerance', () => {
    expect(isFutureTimestamp(String(nowSec + maxFutureSkewSeconds + 1), now)).toBe(true);
    expect(isFutureTimestamp([String(nowSec + 86_400)], now)).toBe(true);
  });

  it('leaves missing or malformed headers to the signature check', () => {
    expect(isFutureTimestamp(undefined, now)).toBe(false);
    expect(isFutureTimestamp('soon', now)).toBe(false);
  });

  it('never refuses a past timestamp (Bolt judges those)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 10 ** 7 }),
        (ago) => !isFutureTimestamp(String(nowSec - ago), now),
      ),
    );
  });
});
