import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PassThrough } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../main.js';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'analyze-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function run(args: string[]) {
  let stdout = '';
  let stderr = '';
  const code = await main(args, {
    stdout: {
      write: (text: string) => {
        stdout += text;
        return true;
      },
    },
    stderr: {
      write: (text: string) => {
        stderr += text;
        return true;
      },
    },
    stdin: new PassThrough(),
  });
  return { code, stdout, stderr };
}

async function csv(name: string, lines: string[]): Promise<string> {
  const path = join(dir, name);
  await writeFile(path, `${lines.join('\n')}\n`);
  return path;
}

/** Daily readings of a tank used at 20 L/day from 900 L, with a 300 L delivery logged on day 5. */
function dailyLines(days: number): string[] {
  const lines = ['time,volume,delivered'];
  for (let d = 0; d < days; d++) {
    const volume = 900 - 20 * d + (d > 5 ? 300 : 0);
    lines.push(`${new Date(Date.UTC(2026, 0, 1 + d, 9)).toISOString()},${volume},`);
    if (d === 5) lines.push('2026-01-06T12:00:00Z,,300');
  }
  return lines;
}

describe('tankrunway analyze', () => {
  it('prints the contract JSON: one point per valid reading, events, and skipped rows on stderr', async () => {
    const lines = dailyLines(12);
    lines.splice(3, 0, '2026-01-02T09:00:00Z,880,', 'not-a-time,5,', '2026-01-03T10:00:00Z,abc,');
    const file = await csv('daily.csv', lines);
    const { code, stdout, stderr } = await run(['analyze', file, '--json']);
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(out.volumeUnit).toBe('L');
    expect(out.points).toHaveLength(12);
    expect(Object.keys(out.points[0]).sort()).toEqual(
      [
        'rate',
        'rateHigh',
        'rateLow',
        'runoutAt',
        'runwayDays',
        'runwayDaysHigh',
        'runwayDaysLow',
        'time',
        'volume',
      ].sort(),
    );
    const last = out.points[11];
    expect(last.rate).toBeCloseTo(20, 1);
    // Output numbers carry 8 significant digits.
    expect(last.runwayDays).toBeCloseTo(last.volume / last.rate, 4);
    expect(last.runwayDaysLow).toBeLessThanOrEqual(last.runwayDays);
    expect(last.runwayDaysHigh).toBeGreaterThanOrEqual(last.runwayDays);
    expect(out.events).toHaveLength(1);
    expect(out.events[0]).toMatchObject({ type: 'delivery', logged: true });
    expect(out.events[0].volume).toBeCloseTo(300, -1);
    expect(stderr).toMatch(/daily\.csv:5: skipped: "not-a-time"/);
    expect(stderr).toMatch(/daily\.csv:6: skipped: volume "abc" is not a number/);
    expect(stderr.trim().split('\n')).toHaveLength(2);
  });

  it('gives the same points for a prefix of the file (causal), in time order even when rows are shuffled', async () => {
    const lines = dailyLines(12);
    const whole = JSON.parse((await run(['analyze', await csv('whole.csv', lines), '--json'])).stdout);
    const shuffled = [lines[0]!, ...lines.slice(1).reverse()];
    const reversed = JSON.parse((await run(['analyze', await csv('rev.csv', shuffled), '--json'])).stdout);
    expect(reversed.points).toEqual(whole.points);
    const prefix = JSON.parse(
      (await run(['analyze', await csv('prefix.csv', lines.slice(0, 6)), '--json'])).stdout,
    );
    expect(prefix.points).toEqual(whole.points.slice(0, 5));
  });

  it('converts to --volume-unit gal (1 US gal = 3.785411784 L exactly, NIST Handbook 44 appendix C)', async () => {
    const file = await csv('litres.csv', dailyLines(10));
    const inLitres = JSON.parse((await run(['analyze', file, '--json'])).stdout);
    const file2 = await csv(
      'gallons.csv',
      dailyLines(10).map((l, i) => {
        if (i === 0) return l;
        const [t, v, d] = l.split(',');
        const g = (x: string | undefined) => (x ? String(Number(x) / 3.785411784) : '');
        return [t, g(v), g(d)].join(',');
      }),
    );
    const inGallons = JSON.parse((await run(['analyze', file2, '--volume-unit', 'gal', '--json'])).stdout);
    expect(inGallons.volumeUnit).toBe('gal');
    const a = inLitres.points[9];
    const b = inGallons.points[9];
    expect(b.rate * 3.785411784).toBeCloseTo(a.rate, 6);
    expect(b.runwayDays).toBeCloseTo(a.runwayDays, 6);
  });

  it('runs to --target and --target-percent, which needs a capacity', async () => {
    const file = await csv('t.csv', dailyLines(10));
    const toTarget = JSON.parse((await run(['analyze', file, '--target', '200', '--json'])).stdout).points[9];
    expect(toTarget.runwayDays).toBeCloseTo((toTarget.volume - 200) / toTarget.rate, 4);
    const pct = JSON.parse(
      (await run(['analyze', file, '--capacity', '2000', '--target-percent', '10', '--json'])).stdout,
    ).points[9];
    expect(pct.runwayDays).toBeCloseTo((pct.volume - 200) / pct.rate, 4);
    const bad = await run(['analyze', file, '--target-percent', '10', '--json']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/needs --capacity or --tank/);
  });

  it('reads levels through --tank, and skips a level above the tank', async () => {
    // A rectangular tank 1 m x 2 m x 1.5 m holds 3 m3; 0.5 m of level is 1000 L (plain box volume).
    const tank = join(dir, 'box.json');
    await writeFile(
      tank,
      JSON.stringify({
        units: { length: 'm', volume: 'L' },
        shape: 'rectangular',
        width: 1,
        length: 2,
        height: 1.5,
      }),
    );
    const lines = ['time,level'];
    for (let d = 0; d < 8; d++)
      lines.push(`${new Date(Date.UTC(2026, 1, 1 + d)).toISOString()},${0.5 - 0.01 * d}`);
    lines.push('2026-02-10T00:00:00Z,1.7');
    const { code, stdout, stderr } = await run([
      'analyze',
      await csv('levels.csv', lines),
      '--tank',
      tank,
      '--json',
    ]);
    expect(code).toBe(0);
    const out = JSON.parse(stdout);
    expect(out.points[0].volume).toBeCloseTo(1000, 6);
    expect(out.points[7].rate).toBeCloseTo(20, 3);
    expect(stderr).toMatch(/:10: skipped: level 1\.7 m is outside this tank/);
  });

  it('answers bad input with exit code 2 and one line', async () => {
    for (const args of [
      ['analyze'],
      ['analyze', join(dir, 'missing.csv')],
      ['analyze', join(dir, 'x.csv'), '--volume-unit', 'pints'],
      ['analyze', join(dir, 'x.csv'), '--target', 'lots'],
    ]) {
      const r = await run(args);
      expect(r.code).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
    }
    const noColumn = await run([
      'analyze',
      await csv('nocol.csv', ['time,height', '2026-01-01T00:00:00Z,3']),
    ]);
    expect(noColumn.code).toBe(2);
    expect(noColumn.stderr).toMatch(/exactly one of the columns/);
  });
});

describe('tankrunway analyze on a filling tank', () => {
  it('tells a filling tank from its data: a pick-up, a negative rate; a runway to full when asked', async () => {
    // A waste tank of 5000 L rising 300 L/day, emptied by a 3000 L pick-up on day 8 (readings every 2 h).
    const lines = ['time,volume'];
    for (let h = 0; h <= 12 * 24; h += 2) {
      const volume = 1000 + (300 * h) / 24 - (h > 8 * 24 ? 3000 : 0);
      lines.push(`${new Date(Date.UTC(2026, 3, 1) + h * 3_600_000).toISOString()},${volume}`);
    }
    const file = await csv('waste.csv', lines);
    const out = JSON.parse((await run(['analyze', file, '--capacity', '5000', '--json'])).stdout);
    expect(out.filling).toBe(true);
    expect(out.events.map((e: { type: string }) => e.type)).toEqual(['pickup']);
    const last = out.points[out.points.length - 1];
    expect(last.rate).toBeCloseTo(-300, 0);
    // The contract's default runway is to empty: none while the tank rises.
    expect(last.runwayDays).toBeNull();
    const toFull = JSON.parse(
      (await run(['analyze', file, '--capacity', '5000', '--filling', '--json'])).stdout,
    );
    const lastFull = toFull.points[toFull.points.length - 1];
    expect(lastFull.runwayDays).toBeCloseTo((5000 - lastFull.volume) / 300, 1);
    const toTarget = JSON.parse(
      (await run(['analyze', file, '--capacity', '5000', '--target', '4500', '--json'])).stdout,
    );
    const lastTarget = toTarget.points[toTarget.points.length - 1];
    expect(lastTarget.runwayDays).toBeCloseTo((4500 - lastTarget.volume) / 300, 1);
    const emptying = JSON.parse(
      (await run(['analyze', await csv('e.csv', dailyLines(10)), '--json'])).stdout,
    );
    expect(emptying.filling).toBe(false);
  });
});
