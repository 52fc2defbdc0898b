import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PassThrough } from 'node:stream';
import { DateTime } from 'luxon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeCommand } from './commands/analyze.js';
import { UsageError } from './io.js';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'refill-option-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function run(args: string[]) {
  let stdout = '';
  let stderr = '';
  const sink = (append: (t: string) => void) => ({
    write: (text: string) => {
      append(text);
      return true;
    },
  });
  // The analyze command alone (not the whole command registry), with cli/main.ts's rule for UsageError.
  const [name, ...rest] = args;
  if (name !== 'analyze') throw new Error('these tests run analyze');
  const io = {
    stdout: sink((t) => {
      stdout += t;
    }),
    stderr: sink((t) => {
      stderr += t;
    }),
    stdin: new PassThrough(),
  };
  let code: number;
  try {
    code = await analyzeCommand.run(rest, io);
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    stderr += `tankrunway analyze: ${error.message}\n`;
    code = 2;
  }
  return { code, stdout, stderr };
}

async function file(name: string, text: string): Promise<string> {
  const path = join(dir, name);
  await writeFile(path, text);
  return path;
}

/** Ridge Pump Station (Kestrel Valley Water Co-op, invented): daily readings from 1900, `perDay` a day. */
function readings(days: number, perDay: number, start = 1900): string {
  const lines = ['time,volume'];
  for (let d = 0; d < days; d++) {
    lines.push(`${new Date(Date.UTC(2026, 10, 20 + d, 15)).toISOString()},${start - perDay * d}`);
  }
  return `${lines.join('\n')}\n`;
}

const contractSettings = {
  threshold: { percent: 20 },
  leadTimeDays: 3,
  businessDays: true,
  orderCutoffHour: 12,
  deliveryWeekdays: [2, 4],
  minimumOrder: 100,
  orderIncrement: 50,
  safeFillPercent: 90,
  serviceLevel: 0.95,
  timeZone: 'America/Chicago',
};

interface Refill {
  verdict: string;
  mode: string;
  orderBy: string | null;
  deliveryBy: string | null;
  thresholdAt: string | null;
  quantity: number | null;
  expectedVolumeOnArrival: number;
  note?: string;
}

async function plan(args: string[], settings: object = contractSettings, series = readings(17, 50)) {
  const csv = await file(`r-${Math.random().toString(36).slice(2)}.csv`, series);
  const json = await file(`s-${Math.random().toString(36).slice(2)}.json`, JSON.stringify(settings));
  return run(['analyze', csv, '--plan', json, ...args]);
}

const chicago = (iso: string) => DateTime.fromISO(iso, { zone: 'America/Chicago' });

describe('tankrunway analyze --plan', () => {
  it('adds the refill object of the contract (section 5), consistent with the settings', async () => {
    const { code, stdout, stderr } = await plan(['--capacity', '2000', '--json']);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const out = JSON.parse(stdout) as { refill: Refill; points: unknown[] };
    expect(out.points).toHaveLength(17);
    const r = out.refill;
    for (const key of [
      'verdict',
      'orderBy',
      'deliveryBy',
      'thresholdAt',
      'quantity',
      'expectedVolumeOnArrival',
    ]) {
      expect(r).toHaveProperty(key);
    }
    // Last reading 1100 L on 6 Dec; 20% of 2000 L = 400 L at 50 L/day: 14 days -> 20 Dec 15:00Z at best,
    // sooner at the 95% service level.
    const threshold = Date.parse(r.thresholdAt ?? '');
    expect(threshold).toBeLessThanOrEqual(Date.parse('2026-12-20T15:00:00Z') + 3_600_000);
    expect(threshold).toBeGreaterThan(Date.parse('2026-12-16T00:00:00Z'));
    const deliveryBy = chicago(r.deliveryBy ?? '');
    const orderBy = chicago(r.orderBy ?? '');
    expect([2, 4]).toContain(deliveryBy.weekday);
    expect(Date.parse(r.deliveryBy ?? '')).toBeLessThanOrEqual(threshold);
    expect(orderBy.toFormat('HH:mm')).toBe('12:00');
    expect(orderBy.weekday).toBeLessThanOrEqual(5);
    expect(r.verdict).toBe('order-by');
    expect((r.quantity ?? 0) % 50).toBe(0);
    expect(r.quantity ?? 0).toBeGreaterThanOrEqual(100);
    expect(r.expectedVolumeOnArrival + (r.quantity ?? 0)).toBeLessThanOrEqual(1800);
    // to the safe fill level from the expected volume: as much as fits in whole increments
    expect(r.expectedVolumeOnArrival + (r.quantity ?? 0) + 50).toBeGreaterThan(1800);
  });

  it('plans in the analysis volume unit (gallons)', async () => {
    const { code, stdout } = await plan(['--volume-unit', 'gal', '--capacity', '2000', '--json']);
    expect(code).toBe(0);
    const r = (JSON.parse(stdout) as { refill: Refill }).refill;
    expect((r.quantity ?? 0) % 50).toBe(0);
    expect(r.expectedVolumeOnArrival + (r.quantity ?? 0)).toBeLessThanOrEqual(1800);
  });

  it('plans at --now: later it says order now, and a local time is read in the settings zone', async () => {
    const late = await plan(['--capacity', '2000', '--now', '2026-12-19T08:00:00Z', '--json']);
    expect((JSON.parse(late.stdout) as { refill: Refill }).refill.verdict).toBe('order-now');
    const early = await plan(['--capacity', '2000', '--now', '2026-11-22T09:00', '--json']);
    // the point used is the last one at or before --now (21 Nov at 15:00Z); the order-by is weeks away
    expect((JSON.parse(early.stdout) as { refill: Refill }).refill.verdict).toBe('no-order-needed');
  });

  it('plans a pick-up for a filling tank', async () => {
    const rising = readings(17, -40, 300);
    const settings = { threshold: { percent: 80 }, leadTimeDays: 2, timeZone: 'America/Chicago' };
    const { code, stdout } = await plan(['--capacity', '2000', '--filling', '--json'], settings, rising);
    expect(code).toBe(0);
    const r = (JSON.parse(stdout) as { refill: Refill }).refill;
    expect(r.mode).toBe('pick-up');
    expect(r.orderBy).not.toBeNull();
  });

  it('without a capacity keeps the dates for a volume threshold and says why there is no quantity', async () => {
    const { code, stdout } = await plan(['--json'], { ...contractSettings, threshold: { volume: 400 } });
    expect(code).toBe(0);
    const r = (JSON.parse(stdout) as { refill: Refill }).refill;
    expect(r.orderBy).not.toBeNull();
    expect(r.quantity).toBeNull();
    expect(r.note).toMatch(/--capacity/);
  });

  it('prints the plan in words without --json', async () => {
    const { code, stdout } = await plan(['--capacity', '2000']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/refill: order by 2026-12-\d\dT/);
    expect(stdout).toMatch(/local codes/);
  });

  it('answers bad settings and times with exit code 2 and one line', async () => {
    const cases: [string[], object, RegExp][] = [
      [['--capacity', '2000'], { ...contractSettings, serviceLevel: 95 }, /serviceLevel/],
      [['--capacity', '2000'], { leadTimeDays: 3 }, /threshold/],
      [[], contractSettings, /percent threshold needs the tank capacity/],
      [['--capacity', '2000', '--now', 'next tuesday'], contractSettings, /--now/],
      [['--capacity', '2000', '--now', '2020-01-01T00:00:00Z'], contractSettings, /before the first reading/],
    ];
    for (const [args, settings, message] of cases) {
      const { code, stderr, stdout } = await plan([...args, '--json'], settings);
      expect(code).toBe(2);
      expect(stderr).toMatch(message);
      expect(stderr.trim().split('\n')).toHaveLength(1);
      expect(stdout).toBe('');
    }
    const badJson = await file('bad.json', '{"threshold": ');
    const csv = await file('ok.csv', readings(3, 50));
    const broken = await run(['analyze', csv, '--plan', badJson, '--json']);
    expect(broken.code).toBe(2);
    expect(broken.stderr).toMatch(/cannot read the refill settings/);
    const noPlan = await run(['analyze', csv, '--now', '2026-12-01T00:00:00Z']);
    expect(noPlan.code).toBe(2);
  });
});
