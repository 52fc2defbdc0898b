// Every reference vector through the engine and through the CLI.
// Source of the vectors: fluids 1.0.22 (Caleb Bell, MIT licence), fluids.geometry.TANK.V_from_h / h_from_V,
// V_partial_sphere and V_vertical_*_concave; vectors with a `reference` field are literal values from fluids'
// own test suite and from the worked examples of D. Jones, "Calculating Tank Volume" and "Compute Fluid
// Volumes in Vertical Tanks" (2003). Copied with its source note into test/fixtures/geometry/.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTank, type Tank } from '../engine/geometry/index.js';
import { type CliRun, runBin, runInProcess } from './fixtures/geometry/run-cli.js';
import {
  CUBIC_METRES_PER_GALLON,
  type ForwardVector,
  forwardVectors,
  type InverseVector,
  inInchesAndGallons,
  inverseVectors,
  specFor,
  withinReference,
} from './fixtures/geometry/vectors.js';

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

// The CLI side: one tank file per distinct geometry, all its levels (or volumes) in one call.
interface TankGroup {
  key: string;
  family: string;
  geometry: ForwardVector['geometry'];
  forward: ForwardVector[];
  inverse: InverseVector[];
}

function groupByGeometry(): TankGroup[] {
  const groups = new Map<string, TankGroup>();
  const groupOf = (v: ForwardVector | InverseVector) => {
    const key = JSON.stringify(specFor(v.geometry));
    let group = groups.get(key);
    if (!group) {
      const g = v.geometry;
      const family = g.shape === 'tank' ? `${g.orientation} ${g.sideA ?? 'flat'}` : g.shape;
      group = { key, family, geometry: g, forward: [], inverse: [] };
      groups.set(key, group);
    }
    return group;
  };
  for (const v of forwardVectors) groupOf(v).forward.push(v);
  for (const v of inverseVectors) groupOf(v).inverse.push(v);
  return [...groups.values()];
}

let dir: string;
const groups = groupByGeometry();
const tankFiles = new Map<string, string>();
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-reference-'));
  await Promise.all(
    groups.map(async (group, i) => {
      const path = join(dir, `tank-${i}.json`);
      await writeFile(path, group.key);
      tankFiles.set(group.key, path);
    }),
  );
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function parsedArray(run: CliRun, what: string): number[] {
  if (run.code !== 0) throw new Error(`${what}: exit ${run.code}: ${run.stderr}`);
  return JSON.parse(run.stdout) as number[];
}

async function checkGroup(
  group: TankGroup,
  run: (args: string[]) => Promise<CliRun>,
  withInverse = true,
): Promise<string[]> {
  const misses: string[] = [];
  const file = tankFiles.get(group.key)!;
  if (group.forward.length > 0) {
    const levels = group.forward.map((v) => String(v.h)).join(',');
    const volumes = parsedArray(
      await run(['volume', '--tank', file, '--levels', levels, '--json']),
      group.family,
    );
    group.forward.forEach((v, i) => {
      if (!withinReference(volumes[i]!, v.V)) misses.push(`${v.id}: CLI ${volumes[i]} vs ${v.V}`);
    });
  }
  if (withInverse && group.inverse.length > 0) {
    const tank = tankFor(group.geometry);
    const volumes = group.inverse.map((v) => String(v.V)).join(',');
    const levels = parsedArray(
      await run(['level', '--tank', file, '--volumes', volumes, '--json']),
      group.family,
    );
    group.inverse.forEach((v, i) => {
      const residual = tank.volumeAt(levels[i]!) / 1000;
      if (!withinReference(residual, v.V))
        misses.push(`${v.id}: CLI level ${levels[i]} gives ${residual} vs ${v.V}`);
    });
  }
  return misses;
}

describe('CLI against the fluids 1.0.22 reference volumes', () => {
  it(`runs all 542 + 73 vectors through tankrunway volume / level (${groups.length} tanks, in process)`, async () => {
    const misses: string[] = [];
    for (const group of groups) misses.push(...(await checkGroup(group, runInProcess)));
    expect(misses).toEqual([]);
    expect(groups.reduce((n, g) => n + g.forward.length, 0)).toBe(542);
    expect(groups.reduce((n, g) => n + g.inverse.length, 0)).toBe(73);
  });

  it('runs one tank of every shape family through the real bin/tankrunway.js (child processes)', async () => {
    // One tank per family keeps the process count small on a shared machine; the in-process run covers the rest.
    const byFamily = new Map<string, TankGroup>();
    for (const group of groups) {
      const best = byFamily.get(group.family);
      if (!best || group.forward.length + group.inverse.length > best.forward.length + best.inverse.length)
        byFamily.set(group.family, group);
    }
    const chosen = [...byFamily.values()];
    expect(chosen.length).toBeGreaterThanOrEqual(12);
    // The inverse through the real bin for the families where the root finder works hardest.
    const inverseFamilies = new Set([
      'horizontal torispherical',
      'vertical torispherical',
      'vertical_concave_bottom',
    ]);
    const misses: string[] = [];
    for (let i = 0; i < chosen.length; i += 2) {
      const pair = await Promise.all(
        chosen.slice(i, i + 2).map((group) => checkGroup(group, runBin, inverseFamilies.has(group.family))),
      );
      misses.push(...pair.flat());
    }
    expect(misses).toEqual([]);
  }, 120_000);
});

describe('CLI in inches and US gallons against the same reference volumes', () => {
  it('gives every forward vector in gallons when the tank file is written in inches and gallons', async () => {
    const misses: string[] = [];
    for (const [i, group] of groups.entries()) {
      const file = join(dir, `tank-${i}-in-gal.json`);
      await writeFile(file, JSON.stringify(inInchesAndGallons(JSON.parse(group.key))));
      const levels = group.forward.map((v) => String(v.h / 0.0254)).join(',');
      const gallons = parsedArray(
        await runInProcess(['volume', '--tank', file, '--levels', levels, '--json']),
        group.family,
      );
      group.forward.forEach((v, k) => {
        const m3 = gallons[k]! * CUBIC_METRES_PER_GALLON;
        if (!withinReference(m3, v.V)) misses.push(`${v.id}: ${m3} vs ${v.V}`);
      });
    }
    expect(misses).toEqual([]);
  });
});
