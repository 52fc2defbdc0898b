import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runInProcess as run } from '../../test/fixtures/geometry/run-cli.js';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-chart-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('tankrunway chart', () => {
  it('prints a CSV chart that reads back as a strapping table with the same volumes', async () => {
    const tank = join(dir, 'north-yard-diesel.json');
    await writeFile(
      tank,
      JSON.stringify({
        units: { length: 'in', volume: 'gal' },
        shape: 'horizontal-cylinder',
        diameter: 48,
        length: 96,
        heads: [
          { type: 'ellipsoidal', depth: 12 },
          { type: 'ellipsoidal', depth: 12 },
        ],
      }),
    );
    const chart = await run(['chart', '--tank', tank, '--step', '2']);
    expect(chart.code).toBe(0);
    const lines = chart.stdout.trimEnd().split('\n');
    expect(lines[0]).toBe('level_in,volume_gal');
    expect(lines).toHaveLength(26);
    const csvPath = join(dir, 'north-yard-chart.csv');
    await writeFile(csvPath, chart.stdout);
    const back = await run(['volume', '--tank', csvPath, '--levels', '24', '--json']);
    const direct = await run(['volume', '--tank', tank, '--levels', '24', '--json']);
    expect(JSON.parse(back.stdout)[0]).toBeCloseTo(JSON.parse(direct.stdout)[0], 4);
  });

  it('gives JSON rows with the units', async () => {
    const tank = join(dir, 'sphere.json');
    await writeFile(
      tank,
      JSON.stringify({ units: { length: 'm', volume: 'L' }, shape: 'sphere', diameter: 1 }),
    );
    const r = await run(['chart', '--tank', tank, '--step', '0.5', '--json']);
    const out = JSON.parse(r.stdout) as {
      lengthUnit: string;
      volumeUnit: string;
      rows: { level: number; volume: number }[];
    };
    expect(out.lengthUnit).toBe('m');
    expect(out.rows.map((row) => row.level)).toEqual([0, 0.5, 1]);
    // Half of a 1 m sphere: (1/12) pi m^3 = 261.799 L (CRC tables).
    expect(out.rows[1]!.volume).toBeCloseTo((Math.PI / 12) * 1000, 6);
  });

  it.each([
    [['--step', '0'], /the step must be a positive number of m/],
    [['--step', 'two'], /--step is required/],
    [['--step', '1e-9'], /choose a larger step/],
  ])('exits 2 with one line for %j', async (args, message) => {
    const tank = join(dir, 'box.json');
    await writeFile(
      tank,
      JSON.stringify({
        units: { length: 'm', volume: 'L' },
        shape: 'rectangular',
        width: 1,
        length: 1,
        height: 1,
      }),
    );
    const r = await run(['chart', '--tank', tank, ...args]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });
});
