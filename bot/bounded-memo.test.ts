import { describe, expect, it } from 'vitest';
import { BoundedMemo } from './bounded-memo.js';

describe('BoundedMemo', () => {
  it('computes an answer once, undefined included', () => {
    const memo = new BoundedMemo<string, number | undefined>(4);
    let calls = 0;
    const compute = (key: string) => {
      calls++;
      return key === 'none' ? undefined : key.length;
    };
    expect(memo.get('abc', compute)).toBe(3);
    expect(memo.get('abc', compute)).toBe(3);
    expect(memo.get('none', compute)).toBeUndefined();
    expect(memo.get('none', compute)).toBeUndefined();
    expect(calls).toBe(2);
  });

  it('forgets the oldest answer beyond its limit, and only that one', () => {
    const memo = new BoundedMemo<number, number>(2);
    const computed: number[] = [];
    const square = (n: number) => {
      computed.push(n);
      return n * n;
    };
    for (const n of [1, 2, 3, 2, 1]) expect(memo.get(n, square)).toBe(n * n);
    // 3 pushed 1 out; 2 stayed; asking for 1 again computes it (and pushes 2 out).
    expect(computed).toEqual([1, 2, 3, 1]);
  });
});
