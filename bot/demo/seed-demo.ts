import { DateTime } from 'luxon';
import { buildTank, type Tank as TankGeometry } from '../../engine/geometry/index.js';
import { fromLitres, fromMetres, isLengthUnit, isVolumeUnit } from '../../engine/units/index.js';
import type { Store } from '../store/index.js';
import { DEMO_TANKS, DEMO_TEAM_NAME, DEMO_TIME_ZONE, DEMO_USERS, type DemoTank } from './kestrel-valley.js';

const DAY_MS = 86_400_000;
/** Months of history: four months of readings end at `now`. */
const HISTORY_DAYS = 120;

/** A small deterministic generator (an LCG), so the demo is the same on every machine. */
function randomFrom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

const round = (value: number, step: number) => Math.round(value / step) * step;
const trim = (value: number) => Number(value.toFixed(4));

/**
 * Seeds the demo team (DEMO DATA, invented) with its tanks and months of readings and deliveries, in one
 * transaction; `admin` (the console user) becomes the team's admin. Only for an empty team; returns false and changes nothing when the team already has tanks.
 */
export function seedDemoTeam(store: Store, teamId: string, now: number, admin?: string): boolean {
  return store.transaction(() => {
    if (store.tanks.list(teamId).length > 0) return false;
    const start = now - HISTORY_DAYS * DAY_MS;
    store.teams.ensure(teamId, start, { name: DEMO_TEAM_NAME, timeZone: DEMO_TIME_ZONE, demo: true });
    store.teams.update(teamId, { name: DEMO_TEAM_NAME });
    // The person who opens the demo is its admin (the first member), so they can try every command.
    if (admin) store.teams.ensureMember(teamId, admin, admin, start);
    for (const [i, u] of DEMO_USERS.entries()) store.teams.ensureMember(teamId, u, u, start + i);
    for (const [i, demo] of DEMO_TANKS.entries())
      seedTank(store, teamId, demo, start, now, randomFrom(1009 * (i + 1)));
    return true;
  });
}

function seedTank(
  store: Store,
  teamId: string,
  demo: DemoTank,
  start: number,
  now: number,
  random: () => number,
) {
  const built = buildTank(demo.spec);
  if (!built.ok) throw new Error(`demo tank ${demo.code}: ${built.error}`);
  const geometry = built.value;
  const tank = store.tanks.add(
    teamId,
    {
      code: demo.code,
      name: demo.name,
      site: demo.site,
      product: demo.product,
      spec: demo.spec,
      settings: demo.settings,
    },
    DEMO_USERS[0],
    start,
  );
  const filling = demo.settings.filling === true;
  const volumeUnit = geometry.spec.units.volume;
  let volume = geometry.capacity * (filling ? 0.2 : 0.7);
  let deliveries = 0;
  let lastRead = start - DAY_MS;
  for (let t = start; t <= now; t += DAY_MS / 24) {
    const local = DateTime.fromMillis(t, { zone: DEMO_TIME_ZONE });
    const perDay = local.weekday >= 6 ? demo.usePerDay.weekend : demo.usePerDay.weekday;
    volume += ((filling ? 1 : -1) * perDay * (0.7 + 0.6 * random())) / 24;
    volume = Math.min(geometry.capacity, Math.max(0, volume));
    const due = filling
      ? volume >= demo.refillAt * geometry.capacity
      : volume <= demo.refillAt * geometry.capacity;
    if (due && local.hour === 10 && local.weekday <= 5) {
      const target = demo.refillTo * geometry.capacity;
      const moved = Math.abs(target - volume);
      volume = target;
      deliveries++;
      // Every third one goes unlogged, as happens: the rate engine finds it from the readings.
      if (deliveries % 3 !== 0 && isVolumeUnit(volumeUnit)) {
        const amount = Math.round(fromLitres(moved, volumeUnit) / 10) * 10;
        const rawText = `delivered ${amount} ${volumeUnit} to ${demo.code}`;
        const d = store.deliveries.add(
          teamId,
          {
            tankId: tank.id,
            time: t,
            volume: amount,
            unit: volumeUnit,
            ticket: `KV-${4100 + deliveries}`,
            rawText,
            userId: DEMO_USERS[1],
          },
          t,
        );
        store.audit.record(
          teamId,
          { userId: DEMO_USERS[1], action: 'delivery.add', target: 'deliveries', targetId: d.id },
          t,
        );
      }
    }
    const hourOfDay = local.hour + local.minute / 60;
    if (
      t - lastRead >= demo.readEveryDays * DAY_MS - DAY_MS / 48 &&
      Math.abs(hourOfDay - Math.floor(demo.readHour)) < 0.5
    ) {
      lastRead = t;
      addReading(
        store,
        teamId,
        tank.id,
        demo,
        geometry,
        volume,
        t + Math.round((demo.readHour % 1) * 3_600_000),
        random,
      );
    }
  }
}

function addReading(
  store: Store,
  teamId: string,
  tankId: number,
  demo: DemoTank,
  geometry: TankGeometry,
  volume: number,
  time: number,
  random: () => number,
) {
  const noise = (random() + random() + random() - 1.5) * 2 * demo.noise;
  const user = DEMO_USERS[Math.floor(random() * DEMO_USERS.length)]!;
  const g = demo.gauge;
  let value: number;
  let unit: string;
  if (g.kind === 'percent') {
    value = trim(Math.min(100, Math.max(0, round((volume / geometry.capacity) * 100 + noise, g.step))));
    unit = '%';
  } else {
    const lengthUnit = isLengthUnit(g.unit) ? g.unit : 'in';
    const level = fromMetres(geometry.levelAt(volume), lengthUnit) + noise;
    value = trim(Math.min(fromMetres(geometry.fullHeight, lengthUnit), Math.max(0, round(level, g.step))));
    unit = g.unit;
  }
  const rawText = `${demo.code} ${value}${unit}`;
  const r = store.readings.add(
    teamId,
    { tankId, time, kind: g.kind, value, unit, rawText, userId: user },
    time,
  );
  store.audit.record(
    teamId,
    { userId: user, action: 'reading.add', target: 'readings', targetId: r.id },
    time,
  );
}
