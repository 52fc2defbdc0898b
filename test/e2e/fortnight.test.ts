// A realistic fortnight through the real console (`tankrunway chat`, piped): three tanks (one with a
// strapping table), readings in mixed units with times in words, a delivery logged and one not, a typo
// caught, an undo, questions; the figures in the replies equal the engine's, computed here directly.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatDuration, formatRate, formatVolume } from '../../bot/replies/format.js';
import { openStore } from '../../bot/store/index.js';
import { tankStatus } from '../../bot/tank-status.js';
import { runwayTo } from '../../engine/forecast/runway.js';
import { buildTank } from '../../engine/geometry/index.js';
import { analyzeSeries } from '../../engine/rate/index.js';
import { fromLitres, toLitres, toMetres } from '../../engine/units/index.js';
import { factOf, replyBlocks, runChat } from './chat-process.js';
import { GEN1, GEN1_DELIVERY, GEN1_SPEC, QUESTIONS_AT, script } from './fortnight-script.js';

const DAY = 86_400_000;

let dir: string;
let blocks: string[];
let stderr: string;
let code: number | null;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tr-fortnight-'));
  const args = ['--db', join(dir, 'team.sqlite'), '--user', 'dana', '--time-zone', 'America/Denver'];
  const run = await runChat([...args, '--now', '2026-11-01T20:00Z'], script());
  blocks = replyBlocks(run.stdout);
  stderr = run.stderr;
  code = run.code;
}, 60_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const find = (pattern: RegExp) => blocks.find((b) => pattern.test(b));

describe('a fortnight through the console', () => {
  it('runs to the end with exit code 0 and nothing on stderr', () => {
    expect(stderr).toBe('');
    expect(code).toBe(0);
  });

  it('sets up three tanks, one from strapping rows sent line by line', () => {
    expect(find(/^Added GEN-1: holds 564 gal/)).toBeDefined();
    // pi * 0.6^2 * 2.5 m^3 = 2,827 L (cylinder volume, elementary geometry).
    expect(find(/^Added HYPO-1: holds 2,827 L/)).toBeDefined();
    expect(find(/^Added T9: holds 1,900 L at 150 cm full height/)).toBeDefined();
  });

  it('catches the typo, asks about the slipped reading, and takes the undo', () => {
    expect(find(/There is no tank named "GEN1"\. Did you mean GEN-1\?/)).toBeDefined();
    expect(
      find(/^GEN-1: 44 in gives 345 gal, which does not fit the recent readings\. Keep it\?/),
    ).toBeDefined();
    expect(find(/^Undone: the reading "GEN-1 44in at 8:15"/)).toBeDefined();
  });

  it('answers GEN-1? with the engine’s own volume, rate and runway', () => {
    const answer = find(/^GEN-1 \(Ridge Pump Station\): /);
    const tank = buildTank(GEN1_SPEC);
    if (!tank.ok) throw new Error(tank.error);
    const levels = GEN1.map((r) => {
      const metres = toMetres(r.value, r.unit);
      return {
        time: Date.parse(r.at),
        volume: tank.value.volumeAt(r.ullage ? tank.value.fullHeight - metres : metres),
      };
    });
    const delivery = { time: Date.parse(GEN1_DELIVERY.at), volume: toLitres(150, 'gal') };
    const series = analyzeSeries(levels, [delivery], { capacity: tank.value.capacity });
    const point = series.points.at(-1)!;
    const gal = (l: number) => fromLitres(l, 'gal');
    const fraction = levels.at(-1)!.volume / tank.value.capacity;
    expect(factOf(answer, 'Volume')).toBe(
      `${formatVolume(gal(levels.at(-1)!.volume), 'gal')} (${Math.round(fraction * 100)}%)`,
    );
    expect(factOf(answer, 'Use')).toBe(
      `${formatRate({ value: gal(point.rate), low: gal(point.rateLow), high: gal(point.rateHigh) }, 'gal')}, from ${point.readings} readings over ${point.basisDays.toFixed(point.basisDays < 10 ? 1 : 0)} days`,
    );
    const runway = runwayTo(point, { volume: 0 }, { capacity: tank.value.capacity });
    const elapsed = (Date.parse(QUESTIONS_AT) - point.time) / DAY;
    const days = formatDuration({
      value: runway.days! - elapsed,
      low: runway.daysLow! - elapsed,
      high: runway.daysHigh! - elapsed,
    });
    expect(factOf(answer, 'Runway')).toMatch(new RegExp(`^${days.replace(/[()]/g, '\\$&')} to empty, `));
    expect(answer).toMatch(/Caution: Fuel is flammable/);
    expect(answer).toMatch(/Chart: .*\.png/);
  });

  it('answers the other questions', () => {
    expect(find(/^HYPO-1 \(Mill Creek Lift Station\): .*runway/)).toMatch(
      /Caution: Hypochlorite must never meet acids/,
    );
    expect(find(/^(No tank runs low this week|\d tanks? runs? low this week)/)).toBeDefined();
    const all = find(/^3 tanks/);
    for (const code of ['GEN-1', 'HYPO-1', 'T9']) expect(all).toContain(code);
  });

  it('stored exactly the readings that were confirmed, raw, with the undone one soft-deleted', () => {
    const store = openStore(join(dir, 'team.sqlite'));
    try {
      const team = 'console:local';
      const gen = store.tanks.byCode(team, 'GEN-1')!;
      const rows = store.readings.forTank(team, gen.id);
      expect(rows.map((r) => r.rawText)).toEqual(GEN1.map((r) => r.text));
      expect(rows.map((r) => r.time)).toEqual(GEN1.map((r) => Date.parse(r.at)));
      expect(store.deliveries.forTank(team, gen.id)).toHaveLength(1);
      const hypo = store.tanks.byCode(team, 'HYPO-1')!;
      expect(store.readings.forTank(team, hypo.id).map((r) => r.unit)).toEqual([
        '%',
        '%',
        'L',
        '%',
        '%',
        '%',
        '%',
      ]);
      const deleted = store.db.prepare('SELECT raw_text FROM readings WHERE deleted_at IS NOT NULL').all();
      expect(deleted).toEqual([{ raw_text: 'GEN-1 44in at 8:15' }]);
      expect(store.teams.get(team)?.timeZone).toBe('America/Denver');
      // The delivery nobody logged is found by the rate engine from the readings alone.
      const events = tankStatus(store, team, hypo.id, Date.parse(QUESTIONS_AT))!.events;
      expect(events.filter((e) => e.type === 'delivery' && !e.logged)).toHaveLength(1);
    } finally {
      store.close();
    }
  });
});
