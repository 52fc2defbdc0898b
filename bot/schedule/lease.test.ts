import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { type TempStore, tempStore } from '../../test/schedule/helpers.js';
import type { Store } from '../store/index.js';
import { createLease } from './lease.js';

let temp: TempStore;
let a: Store;
let b: Store;
beforeEach(() => {
  temp = tempStore();
  a = temp.open();
  b = temp.open(); // a second process on the same file
});
afterEach(() => temp.cleanup());

describe('createLease', () => {
  it('lets one holder at a time post, hands over on expiry, and at once on release', () => {
    const one = createLease(a.db, 'scheduler', 'one', 60_000);
    const two = createLease(b.db, 'scheduler', 'two', 60_000);
    expect(one.acquire(0)).toBe(true);
    expect(two.acquire(1_000)).toBe(false);
    expect(one.acquire(40_000)).toBe(true); // renewed past half its term: now good until 100 s
    expect(two.acquire(70_000)).toBe(false);
    expect(two.acquire(100_000)).toBe(true); // one went silent: its lease lapsed
    expect(one.holds(100_000)).toBe(false);
    expect(one.acquire(100_001)).toBe(false);
    two.release();
    expect(one.acquire(100_002)).toBe(true);
  });

  it('keeps other named leases apart', () => {
    expect(createLease(a.db, 'scheduler', 'one', 60_000).acquire(0)).toBe(true);
    expect(createLease(b.db, 'imports', 'two', 60_000).acquire(0)).toBe(true);
  });
});
