import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraryTankSpec } from '../../test/fixtures/geometry/arbitrary-tank.js';
import { buildTank, levelAtVolume, type Tank, type TankSpec, volumeAtLevel } from './index.js';

const tank = (spec: unknown): Tank => {
  const r = buildTank(spec);
  if (!r.ok) throw new Error(r.error);
  return r.value;
};
const m = { length: 'm', volume: 'm3' } as const;
const m3 = (t: Tank, h: number) => t.volumeAt(h) / 1000;

describe('handbook closed forms', () => {
  it("horizontal flat-ended cylinder: circular segment area times length (Perry's Handbook; CRC tables)", () => {
    const R = 1.2;
    const L = 4.5;
    const t = tank({ units: m, shape: 'horizontal-cylinder', diameter: 2 * R, length: L });
    for (const h of [0.001, 0.3, 1.2, 1.9, 2.399]) {
      const segment = R * R * Math.acos((R - h) / R) - (R - h) * Math.sqrt(2 * R * h - h * h);
      expect(m3(t, h)).toBeCloseTo(segment * L, 10);
    }
  });

  it('sphere: spherical cap pi h^2 (3R - h) / 3 (CRC Standard Mathematical Tables)', () => {
    const R = 1.5;
    const t = tank({ units: m, shape: 'sphere', diameter: 3 });
    for (const h of [0, 0.2, 1.5, 2.7, 3])
      expect(m3(t, h)).toBeCloseTo((Math.PI * h * h * (3 * R - h)) / 3, 10);
    expect(t.capacity / 1000).toBeCloseTo((4 / 3) * Math.PI * R ** 3, 10);
  });

  it('two hemispherical ends with no shell make a sphere, horizontally and vertically (geometry identity)', () => {
    const hemi = { type: 'spherical', depth: 1 };
    const sphere = tank({ units: m, shape: 'sphere', diameter: 2 });
    const horizontal = tank({
      units: m,
      shape: 'horizontal-cylinder',
      diameter: 2,
      length: 0,
      heads: [hemi, hemi],
    });
    const vertical = tank({
      units: m,
      shape: 'vertical-cylinder',
      diameter: 2,
      length: 0,
      heads: [hemi, hemi],
    });
    for (const h of [0.01, 0.4, 1, 1.37, 1.99]) {
      expect(m3(horizontal, h)).toBeCloseTo(m3(sphere, h), 10);
      expect(m3(vertical, h)).toBeCloseTo(m3(sphere, h), 10);
    }
  });

  it('vertical cone bottom: pi R^2 h^3 / (3 a^2) up to the shell (CRC tables, cone volume)', () => {
    const t = tank({
      units: m,
      shape: 'vertical-cylinder',
      diameter: 2,
      length: 3,
      heads: [{ type: 'conical', depth: 0.8 }],
    });
    expect(m3(t, 0.5)).toBeCloseTo((Math.PI * 0.5 ** 3) / (3 * 0.8 ** 2), 12);
    expect(m3(t, 2)).toBeCloseTo((Math.PI * 0.8) / 3 + Math.PI * 1.2, 12);
    expect(t.fullHeight).toBeCloseTo(3.8, 12);
  });

  it('a 90%-by-volume check in other units: a 48 in x 96 in box holds 48*96*h in^3 (exact arithmetic)', () => {
    const t = tank({
      units: { length: 'in', volume: 'gal' },
      shape: 'rectangular',
      width: 48,
      length: 96,
      height: 60,
    });
    // 1 US gal = 231 in^3 exactly (NIST Handbook 44 appendix C).
    expect(t.volumeAt(30 * 0.0254) / 3.785411784).toBeCloseTo((48 * 96 * 30) / 231, 9);
  });
});

describe('laws that hold for every tank (fast-check)', () => {
  it('the volume never decreases with the level, from V(0) to V(full) = capacity', () => {
    fc.assert(
      fc.property(
        arbitraryTankSpec,
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 2, maxLength: 30 }),
        (spec, fractions) => {
          const t = tank(spec);
          const levels = fractions.map((f) => f * t.fullHeight).sort((a, b) => a - b);
          const volumes = levels.map((h) => t.volumeAt(h));
          // Floating-point rounding may wiggle a flat stretch by a few ulps of the capacity, no more.
          const ulps = 1e-13 * t.capacity;
          for (let i = 1; i < volumes.length; i++)
            expect(volumes[i]!).toBeGreaterThanOrEqual(volumes[i - 1]! - ulps);
          const first = spec.shape === 'strapping' ? spec.table[0]![1] * 3.785411784 : 0;
          expect(t.volumeAt(0)).toBeCloseTo(first, 9);
          expect(t.volumeAt(t.fullHeight)).toBe(t.capacity);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('level(volume(h)) = h to 1e-9 of the height, unless double precision cannot tell those levels apart', () => {
    fc.assert(
      fc.property(
        arbitraryTankSpec,
        fc.double({ min: 0, max: 1, noNaN: true }),
        (spec: TankSpec, fraction) => {
          const t = tank(spec);
          const H = t.fullHeight;
          const h = fraction * H;
          const v = t.volumeAt(h);
          const back = t.levelAt(v);
          const noise = 1e-12 * t.capacity;
          // Ill-conditioned only where the volume 1e-9 H away is still within rounding noise (a flat stretch,
          // the top of a horizontal tank): there many levels share the volume, and the volume must match.
          const distinguishable =
            Math.abs(t.volumeAt(Math.min(H, h + 1e-9 * H)) - v) > noise &&
            Math.abs(t.volumeAt(Math.max(0, h - 1e-9 * H)) - v) > noise;
          if (distinguishable) expect(Math.abs(back - h)).toBeLessThanOrEqual(1e-9 * H);
          else expect(Math.abs(t.volumeAt(back) - v)).toBeLessThanOrEqual(noise);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('checked conversions and friendly errors', () => {
  const cyl = tank({
    units: { length: 'in', volume: 'gal' },
    shape: 'vertical-cylinder',
    diameter: 48,
    length: 60,
  });

  it('refuses a level below 0 or above the tank, naming the range in the tank units', () => {
    const below = volumeAtLevel(cyl, -0.01);
    expect(below.ok ? '' : below.error).toMatch(/between 0 and 60 in/);
    const above = volumeAtLevel(cyl, 61 * 0.0254);
    expect(above.ok ? '' : above.error).toMatch(/level 61 in is outside/);
    expect(volumeAtLevel(cyl, Number.NaN).ok).toBe(false);
  });

  it('refuses a volume above capacity or below zero', () => {
    const over = levelAtVolume(cyl, cyl.capacity * 1.01);
    expect(over.ok ? '' : over.error).toMatch(/does not fit.*gal/);
    expect(levelAtVolume(cyl, -1).ok).toBe(false);
    const full = levelAtVolume(cyl, cyl.capacity);
    expect(full.ok && full.value).toBeCloseTo(60 * 0.0254, 12);
  });

  it('treats a level or volume a rounding hair beyond full as full', () => {
    const level = volumeAtLevel(cyl, cyl.fullHeight * (1 + 1e-10));
    expect(level.ok && level.value).toBe(cyl.capacity);
    const volume = levelAtVolume(cyl, cyl.capacity * (1 + 5e-8));
    expect(volume.ok && volume.value).toBe(cyl.fullHeight);
  });

  it('never throws, whatever it is given (fast-check), and refuses sizes that overflow', () => {
    fc.assert(
      fc.property(fc.anything(), (input) => {
        const r = buildTank(input);
        if (!r.ok) expect(r.error).toMatch(/^tank: /);
      }),
    );
    const huge = buildTank({ units: m, shape: 'sphere', diameter: 1e200 });
    expect(huge.ok ? '' : huge.error).toMatch(/no usable volume/);
  });

  it('reads a head of depth 0 as a flat end', () => {
    const zero = tank({
      units: m,
      shape: 'horizontal-cylinder',
      diameter: 2,
      length: 3,
      heads: [{ type: 'conical', depth: 0 }],
    });
    const flat = tank({ units: m, shape: 'horizontal-cylinder', diameter: 2, length: 3 });
    expect(zero.volumeAt(0.7)).toBe(flat.volumeAt(0.7));
  });

  it('hands back the same frozen tank for the same JSON (a small cache), and a new one for another', () => {
    const spec = { units: m, shape: 'sphere', diameter: 3 };
    const first = tank(spec);
    expect(tank({ ...spec })).toBe(first);
    expect(Object.isFrozen(first.spec)).toBe(true);
    expect(Object.isFrozen(first.spec.units)).toBe(true);
    expect(tank({ ...spec, diameter: 4 })).not.toBe(first);
  });

  it('accepts the unit words people write in a tank file', () => {
    const r = buildTank({ units: { length: 'inches', volume: 'gallons' }, shape: 'sphere', diameter: 10 });
    expect(r.ok && r.value.spec.units).toEqual({ length: 'in', volume: 'gal' });
  });

  it.each([
    [{ units: m, shape: 'sphere', diameter: -2 }, /diameter must be a positive number of m/],
    [{ units: m, shape: 'sphere' }, /diameter must be a positive number of m/],
    [{ units: m, shape: 'cube', diameter: 2 }, /shape must be one of/],
    [{ shape: 'sphere', diameter: 2 }, /units is missing/],
    [
      { units: { length: 'yards', volume: 'L' }, shape: 'sphere', diameter: 2 },
      /units.length must be one of mm, cm, m, in, ft/,
    ],
    [{ units: m, shape: 'sphere', diamter: 2 }, /unknown key "diamter"|diameter must be/],
    [
      {
        units: m,
        shape: 'horizontal-cylinder',
        diameter: 2,
        length: 3,
        heads: [{ type: 'spherical', depth: 1.5 }],
      },
      /cannot exceed the radius/,
    ],
    [
      { units: m, shape: 'horizontal-cylinder', diameter: 2, length: 3, heads: [{ type: 'torispherical' }] },
      /needs f .* and k/,
    ],
    [
      { units: m, shape: 'horizontal-cylinder', diameter: 2, length: 3, heads: [{ type: 'conical' }] },
      /needs its depth in m/,
    ],
    [
      { units: m, shape: 'vertical-cylinder', diameter: 2, length: 3, heads: [{ type: 'guppy', depth: 1 }] },
      /guppy heads exist only on horizontal/,
    ],
    [
      {
        units: m,
        shape: 'vertical-cylinder',
        diameter: 2,
        length: 3,
        heads: [null, { type: 'conical', depth: 1, inward: true }],
      },
      /only the bottom head/,
    ],
    [
      {
        units: m,
        shape: 'vertical-cylinder',
        diameter: 2,
        length: 0.5,
        heads: [{ type: 'conical', depth: 1, inward: true }],
      },
      /above the shell/,
    ],
    [{ units: m, shape: 'strapping', table: [[0, 0]] }, /at least two rows/],
    [
      {
        units: m,
        shape: 'strapping',
        table: [
          [0, 0],
          [1, 5],
          [1, 6],
        ],
      },
      /levels must increase/,
    ],
    [
      {
        units: m,
        shape: 'strapping',
        table: [
          [0, 0],
          [1, 5],
          [2, 4],
        ],
      },
      /volumes must not decrease/,
    ],
    [null, /shape must be one of|not a valid/],
    ['a string', /shape must be one of|not a valid/],
  ])('explains a bad tank: %j', (input, message) => {
    const r = buildTank(input);
    expect(r.ok ? '' : r.error).toMatch(message);
  });
});
