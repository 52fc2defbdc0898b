import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runInProcess as run } from '../../test/fixtures/geometry/run-cli.js';

const json = async (args: string[]) => {
  const r = await run(['eta', ...args, '--json']);
  if (r.code !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout) as Record<string, unknown>;
};

describe('tankrunway eta', () => {
  it('answers the contract example: 3760 gal at 3 out, 1 in gal/min -> 2 gal/min net, 31.333 h', async () => {
    const out = await json([
      '--volume',
      '3760',
      '--inflow',
      '1',
      '--outflow',
      '3',
      '--volume-unit',
      'gal',
      '--flow-unit',
      'gal/min',
    ]);
    expect(out).toMatchObject({ netOutflow: 2, state: 'emptying', volumeUnit: 'gal', flowUnit: 'gal/min' });
    expect(out.hours).toBeCloseTo(31.3333333333, 8);
    expect(out.days).toBeCloseTo(1.30555555556, 9);
  });

  it('runs down to a target volume or to a percent of capacity', async () => {
    const base = [
      '--volume',
      '3760',
      '--inflow',
      '1',
      '--outflow',
      '3',
      '--volume-unit',
      'gal',
      '--flow-unit',
      'gal/min',
    ];
    expect((await json([...base, '--target', '500'])).hours).toBeCloseTo(1630 / 60, 9);
    // 10% of 7520 gal is 752 gal: (3760 - 752) / 2 gal/min = 1504 min.
    expect((await json([...base, '--capacity', '7520', '--target-percent', '10'])).hours).toBeCloseTo(
      1504 / 60,
      9,
    );
  });

  it('converts mixed units: 1,550 L with 40 L/h in and 0.5 gpm out', async () => {
    const out = await json([
      '--volume',
      '1,550 L',
      '--inflow',
      '40 L/h',
      '--outflow',
      '0.5 gpm',
      '--flow-unit',
      'L/h',
    ]);
    // 0.5 gal/min = 0.5 * 3.785411784 * 60 L/h (NIST HB 44); net = that - 40 L/h.
    const net = 0.5 * 3.785411784 * 60 - 40;
    expect(out.netOutflow).toBeCloseTo(net, 9);
    expect(out.hours).toBeCloseTo(1550 / net, 9);
  });

  it('takes the capacity and the volume unit from a tank file', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'tankrunway-eta-'));
    try {
      const tank = join(dir, 'ridge-pump-station.json');
      // 48 x 96 x 60 in box: 276480 in^3 = 1196.88 gal (1 gal = 231 in^3, NIST HB 44).
      await writeFile(
        tank,
        JSON.stringify({
          units: { length: 'in', volume: 'gal' },
          shape: 'rectangular',
          width: 48,
          length: 96,
          height: 60,
        }),
      );
      const out = await json([
        '--tank',
        tank,
        '--volume',
        '600',
        '--outflow',
        '2',
        '--flow-unit',
        'gal/h',
        '--target-percent',
        '25',
      ]);
      expect(out.volumeUnit).toBe('gal');
      expect(out.target).toBeCloseTo(276480 / 231 / 4, 9);
      expect(out.hours).toBeCloseTo((600 - 276480 / 231 / 4) / 2, 9);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });

  it('says a filling tank fills, with the time to full when the capacity is known', async () => {
    const out = await json([
      '--volume',
      '100',
      '--inflow',
      '5',
      '--outflow',
      '3',
      '--flow-unit',
      'gal/min',
      '--capacity',
      '340',
    ]);
    expect(out).toMatchObject({ state: 'filling', hours: null, days: null, netOutflow: -2, hoursToFull: 2 });
    const steady = await json([
      '--volume',
      '100',
      '--inflow',
      '3',
      '--outflow',
      '3',
      '--flow-unit',
      'gal/min',
    ]);
    expect(steady).toMatchObject({ state: 'steady', hours: null });
  });

  it.each([
    [['--inflow', '1', '--outflow', '3', '--flow-unit', 'gal/min'], /--volume is required/],
    [['--volume', '10', '--outflow', '3'], /--flow-unit is required/],
    [['--volume', '10', '--outflow', '3', '--flow-unit', 'gal/fortnight'], /"fortnight"/],
    [['--volume', '10', '--outflow', '3', '--flow-unit', 'gal'], /not a flow/],
    [
      ['--volume', '10', '--outflow', '3', '--flow-unit', 'gal/min', '--target-percent', '10'],
      /needs --capacity/,
    ],
    [['--volume', '10', '--outflow', '3', '--flow-unit', 'gal/min', '--capacity', '5'], /above the capacity/],
    [['--volume', '10', '--outflow', 'lots', '--flow-unit', 'gal/min'], /--outflow/],
  ])('exits 2 with one line on stderr for %j', async (args, message) => {
    const r = await run(['eta', ...args]);
    expect(r.code).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });
});
