import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runInProcess as run } from '../../test/fixtures/geometry/run-cli.js';

let dir: string;
let tankPath: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tankrunway-volume-'));
  tankPath = join(dir, 'ridge-day-tank.json');
  // A 48 in x 96 in rectangular day tank, 60 in tall: 48 * 96 / 231 gal per inch of level (1 gal = 231 in^3, NIST HB 44).
  await writeFile(
    tankPath,
    JSON.stringify({
      units: { length: 'in', volume: 'gal' },
      shape: 'rectangular',
      width: 48,
      length: 96,
      height: 60,
    }),
  );
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const perInch = (48 * 96) / 231;

describe('tankrunway volume', () => {
  it('prints one volume per level, in order, as JSON in the tank units', async () => {
    const r = await run(['volume', '--tank', tankPath, '--levels', '0,10,62cm,60', '--json']);
    expect(r.code).toBe(0);
    const volumes = JSON.parse(r.stdout) as number[];
    expect(volumes).toHaveLength(4);
    expect(volumes[0]).toBe(0);
    expect(volumes[1]).toBeCloseTo(10 * perInch, 9);
    expect(volumes[2]).toBeCloseTo((62 / 2.54) * perInch, 9);
    expect(volumes[3]).toBeCloseTo(60 * perInch, 9);
  });

  it('reads ullages measured down from the top, or from a reference height', async () => {
    const r = await run(['volume', '--tank', tankPath, '--ullages', '20', '--json']);
    expect(JSON.parse(r.stdout)[0]).toBeCloseTo(40 * perInch, 9);
    const ref = await run(['volume', '--tank', tankPath, '--ullages', '30', '--reference', '66', '--json']);
    expect(JSON.parse(ref.stdout)[0]).toBeCloseTo(36 * perInch, 9);
  });

  it('prints readable lines without --json', async () => {
    const r = await run(['volume', '--tank', tankPath, '--levels', '30']);
    expect(r.stdout).toBe(`30 in: ${Number((30 * perInch).toPrecision(8))} gal\n`);
  });

  it.each([
    [['--levels', '61'], /level 61 in is outside this tank: it must be between 0 and 60 in/],
    [['--levels=-1'], /level -1 in is outside/],
    [['--levels', '10,abc'], /"abc"/],
    [['--levels', '10 furlongs'], /"furlongs" is not a unit/],
    [['--levels', '10 gal'], /10 gal is not a length/],
    [['--levels', ''], /--levels is required/],
    [[], /give --levels .* or --ullages/],
    [['--ullages', '70'], /deeper than the reference height/],
  ])('exits 2 with one line on stderr for %j', async (args, message) => {
    const r = await run(['volume', '--tank', tankPath, ...args]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(message);
  });
});

describe('volume, level and chart never crash on what is typed (fast-check)', () => {
  it('answers 0 with output or 2 with one line on stderr, for any arguments', async () => {
    const option = fc.constantFrom(
      '--levels',
      '--ullages',
      '--reference',
      '--volumes',
      '--step',
      '--json',
      '--tank',
      '--bogus',
    );
    const value = fc.oneof(
      fc.string({ maxLength: 12 }),
      fc.double().map(String),
      fc.constantFrom('1,2', '62in', '5\' 2"', '-1', '1e400', ''),
    );
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('volume', 'level', 'chart'),
        fc.array(fc.tuple(option, value), { maxLength: 4 }),
        async (command, pairs) => {
          const args = [command, '--tank', tankPath, ...pairs.flat()];
          const r = await run(args);
          expect([0, 2]).toContain(r.code);
          if (r.code === 2) expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
          else expect(r.stdout.length).toBeGreaterThan(0);
        },
      ),
      { numRuns: 200 },
    );
  });
});
