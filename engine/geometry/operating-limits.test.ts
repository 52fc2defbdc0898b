import { describe, expect, it } from 'vitest';
import {
  buildTank,
  deadStockVolume,
  levelFromUllage,
  SAFE_FILL_CAUTION,
  safeFill,
  type Tank,
  usableVolume,
} from './index.js';

const box = (() => {
  // A 1 m x 2 m x 1.5 m box holds 2000 L per metre of level.
  const r = buildTank({
    units: { length: 'cm', volume: 'L' },
    shape: 'rectangular',
    width: 100,
    length: 200,
    height: 150,
  });
  if (!r.ok) throw new Error(r.error);
  return r.value;
})();
const value = <T>(r: { ok: true; value: T } | { ok: false; error: string }): T => {
  if (!r.ok) throw new Error(r.error);
  return r.value;
};
const error = (r: { ok: boolean; error?: string }) => (r.ok ? '' : (r.error ?? ''));

describe('ullage', () => {
  it('turns a distance down from the top into a level (reference height minus ullage, common practice)', () => {
    expect(value(levelFromUllage(box, 0.4))).toBeCloseTo(1.1, 12);
    expect(value(levelFromUllage(box, 0.5, 1.7))).toBeCloseTo(1.2, 12);
  });
  it('refuses an ullage deeper than the reference or one that puts the liquid above the tank', () => {
    expect(error(levelFromUllage(box, 1.6))).toMatch(/160 cm is deeper than the reference height 150 cm/);
    expect(error(levelFromUllage(box, 0.1, 1.7))).toMatch(/above the tank's full height 150 cm/);
    expect(error(levelFromUllage(box, -1))).toMatch(/zero or more/);
  });
});

describe('safe fill', () => {
  it('defaults to 90% of capacity (common practice) with the caution that codes come first', () => {
    const fill = value(safeFill(box));
    expect(fill.percent).toBe(90);
    expect(fill.volume).toBeCloseTo(2700, 9);
    expect(fill.level).toBeCloseTo(1.35, 9);
    expect(fill.caution).toBe(SAFE_FILL_CAUTION);
    expect(SAFE_FILL_CAUTION).toMatch(/LPG.*local codes/);
  });
  it('takes another percent, and refuses nonsense', () => {
    expect(value(safeFill(box, 80)).volume).toBeCloseTo(2400, 9);
    expect(error(safeFill(box, 120))).toMatch(/at most 100/);
    expect(error(safeFill(box, 0))).toMatch(/above 0/);
  });
});

describe('dead stock', () => {
  it('is the volume below the outlet; usable volume never goes below zero', () => {
    const dead = value(deadStockVolume(box, 0.1));
    expect(dead).toBeCloseTo(200, 9);
    expect(usableVolume(1000, dead)).toBeCloseTo(800, 9);
    expect(usableVolume(150, dead)).toBe(0);
  });
  it('refuses an outlet above the tank', () => {
    expect(error(deadStockVolume(box as Tank, 2))).toMatch(/outlet height: level 200 cm is outside/);
  });
});
