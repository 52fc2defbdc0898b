import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runInProcess as run } from '../../test/fixtures/geometry/run-cli.js';

let dir: string;
let tankPath: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-level-'));
  tankPath = join(dir, 'mill-creek-sphere.json');
  await writeFile(
    tankPath,
    JSON.stringify({ units: { length: 'm', volume: 'm3' }, shape: 'sphere', diameter: 2 }),
  );
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('tankrunway level', () => {
  it('inverts the volume: half a sphere sits at its equator; percent means percent of capacity', async () => {
    // Sphere of radius 1 m: 4/3 pi m^3 full, half at h = 1 m (spherical cap, CRC tables).
    const half = (2 / 3) * Math.PI;
    const r = await run(['level', '--tank', tankPath, '--volumes', `0,${half},50%,4188.79 L`, '--json']);
    expect(r.code).toBe(0);
    const levels = JSON.parse(r.stdout) as number[];
    expect(levels[0]).toBe(0);
    expect(levels[1]).toBeCloseTo(1, 9);
    expect(levels[2]).toBeCloseTo(1, 9);
    expect(levels[3]).toBeCloseTo(2, 2);
  });

  it.each([
    [['--volumes', '5'], /volume 5 m3 does not fit this tank: it holds 0 to 4.18879 m3/],
    [['--volumes', '120%'], /not between 0 and 100/],
    [['--volumes', '2 ft'], /is not a volume/],
    [[], /--volumes is required/],
  ])('exits 2 with one line on stderr for %j', async (args, message) => {
    const r = await run(['level', '--tank', tankPath, ...args]);
    expect(r.code).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });
});
