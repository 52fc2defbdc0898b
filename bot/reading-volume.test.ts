import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildTank } from '../engine/geometry/index.js';
import { readingLevelMetres, readingLitres } from './reading-volume.js';

const built = buildTank({
  units: { length: 'cm', volume: 'L' },
  shape: 'rectangular',
  width: 100,
  length: 200,
  height: 150,
});
if (!built.ok) throw new Error(built.error);
const box = built.value;

describe('readingLitres', () => {
  it('reads a level, an ullage, a percent and a volume of a box tank', () => {
    // A box holds width x length x level: 1 m x 2 m x 0.6 m = 1.2 m^3 = 1,200 L (elementary geometry).
    expect(readingLitres(box, { kind: 'level', value: 60, unit: 'cm' })).toEqual({
      ok: true,
      value: expect.closeTo(1200, 9),
    });
    expect(readingLitres(box, { kind: 'ullage', value: 90, unit: 'cm' })).toEqual({
      ok: true,
      value: expect.closeTo(1200, 9),
    });
    expect(readingLitres(box, { kind: 'percent', value: 40, unit: '%' })).toEqual({
      ok: true,
      value: expect.closeTo(1200, 9),
    });
    // 1 US gal = 3.785411784 L exactly (NIST Handbook 44, appendix C).
    expect(readingLitres(box, { kind: 'volume', value: 100, unit: 'gal' })).toEqual({
      ok: true,
      value: expect.closeTo(378.5411784, 9),
    });
    expect(readingLevelMetres(box, { kind: 'ullage', value: 90, unit: 'cm' })).toBeCloseTo(0.6, 12);
    expect(readingLevelMetres(box, { kind: 'percent', value: 40, unit: '%' })).toBeUndefined();
  });

  it('refuses what the tank cannot hold, saying what to check', () => {
    const cases = [
      { kind: 'level', value: 151, unit: 'cm' },
      { kind: 'ullage', value: 2, unit: 'm' },
      { kind: 'percent', value: 101, unit: '%' },
      { kind: 'volume', value: 3001, unit: 'L' },
      { kind: 'level', value: -1, unit: 'cm' },
      { kind: 'level', value: 10, unit: 'furlong' },
      { kind: 'volume', value: 10, unit: 'cup' },
      { kind: 'level', value: Number.NaN, unit: 'cm' },
    ] as const;
    for (const m of cases) {
      const result = readingLitres(box, m);
      expect(result.ok).toBe(false);
      if (!result.ok) expect(result.error).toMatch(/check|use|must|more than|percent/);
    }
  });

  it('gives a volume between 0 and the capacity for every level inside the tank', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 150, noNaN: true }), (level) => {
        const result = readingLitres(box, { kind: 'level', value: level, unit: 'cm' });
        expect(result.ok).toBe(true);
        if (result.ok) expect(result.value).toBeGreaterThanOrEqual(0);
        if (result.ok) expect(result.value).toBeLessThanOrEqual(box.capacity * (1 + 1e-12));
      }),
    );
  });
});
