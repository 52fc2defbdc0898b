import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runwayTo } from '../engine/forecast/runway.js';
import { buildTank } from '../engine/geometry/index.js';
import { analyzeSeries } from '../engine/rate/index.js';
import { planRefill } from '../engine/refill/planRefill.js';
import { openStore, type Store } from './store/index.js';
import { tankStatus } from './tank-status.js';

const DAY = 86_400_000;
const T0 = Date.UTC(2026, 10, 2, 7, 30);
const TEAM = 'console:status';
const spec = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-status-'));
  store = openStore(join(dir, 'bot.sqlite'));
  store.teams.ensure(TEAM, T0);
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

function addLevel(tankId: number, time: number, inches: number, unit = 'in', value = inches) {
  return store.readings.add(
    TEAM,
    { tankId, time, kind: 'level', value, unit, rawText: `T4 ${value}${unit}`, userId: 'u1' },
    time,
  );
}

describe('tankStatus', () => {
  it('turns a level into the volume of a vertical cylinder', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    addLevel(tank.id, T0, 60);
    const status = tankStatus(store, TEAM, tank.id, T0 + 3_600_000)!;
    // Cylinder volume pi r^2 h (elementary geometry) with 1 US gal = 231 in^3 exactly (NIST Handbook 44,
    // appendix C): pi * 24^2 * 60 / 231 = 470.01 gal.
    expect(status.latest?.volume).toBeCloseTo((Math.PI * 24 ** 2 * 60) / 231, 6);
    expect(status.capacity).toBeCloseTo((Math.PI * 24 ** 2 * 72) / 231, 6);
    expect(status.latest?.fraction).toBeCloseTo(60 / 72, 9);
    expect(status.latest?.level).toBeCloseTo(60, 9);
    expect(status.latest?.ageMs).toBe(3_600_000);
    expect(status.volumeUnit).toBe('gal');
  });

  it('gives the same rate and runway as the engine computes directly', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    const levels = [60, 58.1, 56.3, 54.2, 52.3, 50.4, 48.6];
    for (const [i, level] of levels.entries()) addLevel(tank.id, T0 + i * DAY, level);
    const now = T0 + 6.5 * DAY;
    const status = tankStatus(store, TEAM, tank.id, now)!;

    const geometry = buildTank(spec);
    if (!geometry.ok) throw new Error(geometry.error);
    const series = levels.map((l, i) => ({
      time: T0 + i * DAY,
      volume: geometry.value.volumeAt(l * 0.0254),
    }));
    const direct = analyzeSeries(series, [], { capacity: geometry.value.capacity });
    const point = direct.points.at(-1)!;
    const litresPerGal = 3.785411784;
    expect(status.rate?.value).toBeCloseTo(point.rate / litresPerGal, 9);
    expect(status.rate?.readings).toBe(point.readings);
    const runway = runwayTo(point, { volume: 0 }, { capacity: geometry.value.capacity });
    expect(status.runway?.target).toBe('empty');
    expect(status.runway?.days).toBeCloseTo(runway.days! - 0.5, 9);
    expect(status.runway?.at).toBe(runway.runoutAt);
    expect(status.rate!.value).toBeGreaterThan(0);
    // The refill plan is engine/refill's, with the default 20% threshold and the team's zone.
    const plan = planRefill({
      now,
      volume: point.volume,
      lastReadingAt: point.time,
      rate: point.rate,
      rateSigma: point.rateSigma,
      capacity: geometry.value.capacity,
      filling: false,
      settings: { threshold: { percent: 20 }, timeZone: 'UTC' },
    });
    if (!plan.ok) throw new Error(plan.error);
    expect(status.refill?.orderBy).toBe(plan.value.orderBy);
    expect(status.refill?.verdict).toBe(plan.value.verdict);
    expect(status.refill?.quantity).toBeCloseTo(plan.value.quantity! / litresPerGal, 9);
    expect(status.refill?.thresholdIsDefault).toBe(true);
  });

  it('recomputes history from the raw input when the shape is corrected', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    addLevel(tank.id, T0, 60);
    const before = tankStatus(store, TEAM, tank.id, T0)!.latest!.volume;
    store.tanks.update(TEAM, tank.id, { spec: { ...spec, diameter: 96 } }, T0 + 1);
    const after = tankStatus(store, TEAM, tank.id, T0)!.latest!.volume;
    expect(after).toBeCloseTo(before * 4, 6);
  });

  it('skips readings the corrected shape cannot hold instead of failing', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    addLevel(tank.id, T0, 70);
    addLevel(tank.id, T0 + DAY, 40);
    store.tanks.update(TEAM, tank.id, { spec: { ...spec, length: 60 } }, T0 + 1);
    const status = tankStatus(store, TEAM, tank.id, T0 + DAY)!;
    expect(status.skipped).toBe(1);
    expect(status.history).toHaveLength(1);
  });

  it('converts mixed units and deliveries, and counts from now', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    addLevel(tank.id, T0, 60);
    addLevel(tank.id, T0 + DAY, 0, 'cm', 147.32); // 58 in
    store.deliveries.add(
      TEAM,
      {
        tankId: tank.id,
        time: T0 + 1.5 * DAY,
        volume: 150,
        unit: 'gal',
        rawText: 'delivered 150 gal to T4',
        userId: 'u1',
      },
      T0,
    );
    const status = tankStatus(store, TEAM, tank.id, T0 + 2 * DAY)!;
    expect(status.history[1]!.volume).toBeCloseTo((Math.PI * 24 ** 2 * 58) / 231, 6);
    expect(status.deliveries).toEqual([{ time: T0 + 1.5 * DAY, volume: 150 }]);
    expect(status.previous?.volume).toBeCloseTo((Math.PI * 24 ** 2 * 60) / 231, 6);
  });

  it('moves the runway as soon as a delivery is logged, before the next reading', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    for (const [i, level] of [60, 58, 56, 54].entries()) addLevel(tank.id, T0 + i * DAY, level);
    const now = T0 + 3.5 * DAY;
    const before = tankStatus(store, TEAM, tank.id, now)!;
    const delivery = { tankId: tank.id, time: T0 + 3.2 * DAY, volume: 100, unit: 'gal' };
    store.deliveries.add(TEAM, { ...delivery, rawText: 'delivered 100 gal to T4', userId: 'u1' }, now);
    const after = tankStatus(store, TEAM, tank.id, now)!;
    // The rate is unchanged (a delivery is an event, not use): 100 gal more last 100 / rate days longer.
    expect(after.rate?.value).toBeCloseTo(before.rate!.value, 9);
    expect(after.runway!.days! - before.runway!.days!).toBeCloseTo(100 / after.rate!.value, 6);
  });

  it('flags a level above the safe fill, and a threshold becomes the runway target', () => {
    const tank = store.tanks.add(
      TEAM,
      { code: 'T4', spec, settings: { threshold: { percent: 20 } } },
      'u1',
      T0,
    );
    addLevel(tank.id, T0, 70);
    const status = tankStatus(store, TEAM, tank.id, T0)!;
    expect(status.overSafeFill).toBe(true);
    expect(status.threshold).toBeCloseTo(status.capacity * 0.2, 9);
  });

  it('answers nothing for another team’s tank, and a problem for an invalid stored shape', () => {
    const tank = store.tanks.add(TEAM, { code: 'T4', spec }, 'u1', T0);
    store.teams.ensure('console:other', T0);
    expect(tankStatus(store, 'console:other', tank.id, T0)).toBeUndefined();
    store.db.prepare(`UPDATE tanks SET spec = '{"shape":"blob"}' WHERE id = ?`).run(tank.id);
    expect(tankStatus(store, TEAM, tank.id, T0)?.problem).toMatch(/not valid/);
  });
});
