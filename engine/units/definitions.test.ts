import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fromLitres,
  fromLitresPerDay,
  fromMetres,
  LENGTH_UNITS,
  toLitres,
  toLitresPerDay,
  toMetres,
  VOLUME_UNITS,
} from './index.js';

describe('exact unit definitions', () => {
  // NIST SP 811 (2008) appendix B.8 and NIST Handbook 44 appendix C: the inch is 2.54 cm exactly,
  // the US gallon 231 in^3 exactly (3.785 411 784 L), the imperial gallon 4.546 09 L exactly.
  it('matches the NIST exact length definitions', () => {
    expect(toMetres(1, 'in')).toBe(0.0254);
    expect(toMetres(1, 'ft')).toBeCloseTo(0.3048, 15);
    expect(toMetres(1000, 'mm')).toBe(1);
    expect(toMetres(157, 'cm')).toBeCloseTo(1.57, 15);
  });
  it('matches the NIST exact volume definitions', () => {
    expect(toLitres(1, 'gal')).toBeCloseTo(3.785411784, 14);
    expect(toLitres(1, 'impgal')).toBe(4.54609);
    expect(toLitres(1, 'in3')).toBeCloseTo(0.016387064, 16);
    // 1 ft^3 = 1728 in^3 = 28.316 846 592 L (NIST SP 811 B.8, exact).
    expect(toLitres(1, 'ft3')).toBeCloseTo(28.316846592, 12);
    // 1 barrel (petroleum) = 42 US gal = 158.987 294 928 L (NIST SP 811 B.8).
    expect(toLitres(1, 'bbl')).toBeCloseTo(158.987294928, 11);
    expect(toLitres(1, 'm3')).toBe(1000);
    // 1 US gal = 231 in^3 exactly (NIST Handbook 44 appendix C).
    expect(toLitres(1, 'gal') / toLitres(1, 'in3')).toBeCloseTo(231, 12);
  });
  it('converts flows to litres per day', () => {
    // 1 gal/min = 1440 gal/d.
    expect(toLitresPerDay(1, { volume: 'gal', time: 'min' })).toBeCloseTo(1440 * 3.785411784, 9);
    expect(fromLitresPerDay(24, { volume: 'L', time: 'h' })).toBeCloseTo(1, 14);
  });
  it('round-trips every length and volume unit', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.constantFrom(...LENGTH_UNITS),
        (x, u) => {
          const back = fromMetres(toMetres(x, u), u);
          return Math.abs(back - x) <= 1e-15 * Math.max(1, Math.abs(x)) * 4;
        },
      ),
    );
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.constantFrom(...VOLUME_UNITS),
        (x, u) => {
          const back = fromLitres(toLitres(x, u), u);
          return Math.abs(back - x) <= 1e-15 * Math.max(1, Math.abs(x)) * 4;
        },
      ),
    );
  });
});
