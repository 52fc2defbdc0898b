// Every reference vector through the engine and through the CLI.
// Source of the vectors: fluids 1.0.22 (Caleb Bell, MIT licence), fluids.geometry.TANK.V_from_h / h_from_V,
// V_partial_sphere and V_vertical_*_concave; vectors with a `reference` field are literal values from fluids'
// own test suite and from the worked examples of D. Jones, "Calculating Tank Volume" and "Compute Fluid
// Volumes in Vertical Tanks" (2003). Copied with its source note into test/fixtures/geometry/.
import { describe, expect, it } from 'vitest';
import { buildTank, type Tank } from '../engine/geometry/index.js';
import { forwardVectors, inverseVectors, specFor, withinReference } from './fixtures/geometry/vectors.js';

const tankFor = (geometry: Parameters<typeof specFor>[0]): Tank => {
  const built = buildTank(specFor(geometry));
  if (!built.ok) throw new Error(built.error);
  return built.value;
};

describe('engine against the fluids 1.0.22 reference volumes', () => {
  it('has the 542 forward and 73 inverse vectors the README announces', () => {
    expect(forwardVectors).toHaveLength(542);
    expect(inverseVectors).toHaveLength(73);
  });

  it('computes every level -> volume within |V - V_ref| <= 1e-7 |V_ref| + 1e-9 m3', () => {
    const misses: string[] = [];
    for (const v of forwardVectors) {
      const tank = tankFor(v.geometry);
      const volume = tank.volumeAt(v.h) / 1000;
      if (!withinReference(volume, v.V)) misses.push(`${v.id}: ${volume} vs ${v.V}`);
      if (Math.abs(tank.fullHeight - v.h_max) > 1e-9 * v.h_max)
        misses.push(`${v.id}: height ${tank.fullHeight}`);
      if (!withinReference(tank.capacity / 1000, v.V_total))
        misses.push(`${v.id}: capacity ${tank.capacity}`);
    }
    expect(misses).toEqual([]);
  });

  it('matches the published worked examples (fluids test suite; D. Jones) literally', () => {
    const literal = forwardVectors.filter((v) => v.reference);
    expect(literal.length).toBe(120);
    for (const v of literal) {
      const volume = tankFor(v.geometry).volumeAt(v.h) / 1000;
      expect(withinReference(volume, v.reference!.value_m3), `${v.id} (${v.reference!.source})`).toBe(true);
    }
  });

  it('inverts every volume -> level: the volume at our level is within the tolerance', () => {
    const misses: string[] = [];
    for (const v of inverseVectors) {
      const tank = tankFor(v.geometry);
      const level = tank.levelAt(v.V * 1000);
      const residual = tank.volumeAt(level) / 1000;
      if (!withinReference(residual, v.V)) misses.push(`${v.id}: V(h)=${residual} vs ${v.V}`);
      // Where the level is well conditioned it also matches fluids' own root (README: 1e-6 m).
      const fullHorizontalTop = v.geometry.orientation === 'horizontal' && v.V >= v.V_total * (1 - 1e-9);
      if (!fullHorizontalTop && v.tags.includes('V_random') && Math.abs(level - v.h) > 1e-6)
        misses.push(`${v.id}: h=${level} vs ${v.h}`);
    }
    expect(misses).toEqual([]);
  });
});
