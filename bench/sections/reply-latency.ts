// Reply latency of a question ("T17?") on a store of 200 tanks x 3 years of hourly readings, through
// bot.handle (store read, rate state resumed from its cache, runway, refill plan, reply with chart data), beside
// `help` through the same bot on the same store as the baseline. The store is a temporary file, seeded once
// and removed after.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { type BenchRow, type BenchSection, percentile } from '../harness.js';

const TANKS = Number(process.env.REPLY_BENCH_TANKS ?? 200);
const HOURS = 3 * 365 * 24;
const SAMPLES = 300;
const TEAM = 'bench:reply';
const START = Date.UTC(2023, 10, 1);
const NOW = START + HOURS * 3_600_000;

/** Seeds raw level readings straight through one prepared statement (the fixture, not what is timed). */
function seed(store: Store): void {
  store.teams.ensure(TEAM, START);
  store.teams.ensureMember(TEAM, 'bench', 'bench', START);
  const insert = store.db.prepare(
    `INSERT INTO readings (team_id, tank_id, time, kind, value, unit, raw_text, user_id, status, created_at)
     VALUES (?, ?, ?, 'level', ?, 'in', ?, 'bench', 'ok', ?)`,
  );
  let state = 99;
  const random = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  for (let t = 0; t < TANKS; t++) {
    store.transaction(() => {
      const tank = store.tanks.add(
        TEAM,
        {
          code: `T${t}`,
          spec: {
            units: { length: 'in', volume: 'gal' },
            shape: 'vertical-cylinder',
            diameter: 96,
            length: 120,
          },
          product: t % 3 === 0 ? 'diesel' : 'water',
        },
        'bench',
        START,
      );
      const use = 0.05 + random() * 0.1; // inches per hour
      let level = 100;
      for (let h = 0; h < HOURS; h++) {
        level -= use * (0.6 + 0.8 * random());
        const time = START + h * 3_600_000;
        if (level < 25) {
          const raw = `delivered ${Math.round((100 - level) * 3.134 * 10)} gal to T${t}`;
          store.deliveries.add(
            TEAM,
            {
              tankId: tank.id,
              time,
              volume: Math.round((100 - level) * 31.34),
              unit: 'gal',
              rawText: raw,
              userId: 'bench',
            },
            time,
          );
          level = 100;
        }
        const value = Math.round((level + (random() - 0.5) * 0.2) * 100) / 100;
        insert.run(TEAM, tank.id, time, value, `T${t} ${value}in`, time);
      }
    });
  }
}

async function latencies(ask: (i: number) => Promise<unknown>, samples = SAMPLES): Promise<number[]> {
  const out: number[] = [];
  for (let i = 0; i < samples; i++) {
    const start = process.hrtime.bigint();
    await ask(i);
    out.push(Number(process.hrtime.bigint() - start) / 1e6);
  }
  return out;
}

export const replyLatencySection: BenchSection = {
  title: `Reply latency: a question on ${TANKS} tanks x 3 years of hourly readings (bot.handle)`,
  async run(): Promise<BenchRow[]> {
    const dir = mkdtempSync(join(tmpdir(), 'tr-bench-reply-'));
    const store = openStore(join(dir, 'bench.sqlite'));
    try {
      const seedStart = Date.now();
      seed(store);
      const seedSeconds = (Date.now() - seedStart) / 1000;
      const bot = createBot({ store });
      const ask = (text: string) =>
        bot.handle({ team: TEAM, channel: 'c', user: 'bench', text, receivedAt: NOW });
      // The bot keeps each tank's rate state as readings arrive; readings seeded behind its back have none
      // yet, so the first question on each tank rebuilds it from all 3 years (timed and reported apart).
      const cold = await latencies((i) => ask(`T${i % TANKS}?`), TANKS);
      const help = await latencies(() => ask('help'));
      const question = await latencies((i) => ask(`T${(i * 37) % TANKS}?`));
      const baseline = { name: '`help` through the same bot', value: percentile(help, 99) };
      return [
        {
          name: `question p50 (${SAMPLES} questions, ${HOURS.toLocaleString('en-US')} readings a tank)`,
          value: percentile(question, 50),
          unit: 'ms',
          baseline: { name: '`help` p50', value: percentile(help, 50) },
        },
        { name: 'question p99', value: percentile(question, 99), unit: 'ms', baseline, goal: '< 50 ms' },
        {
          name: 'first question on a tank after a bulk import (rate state rebuilt), p50',
          value: percentile(cold, 50),
          unit: 'ms',
          baseline,
        },
        { name: 'seeding the store (fixture, not a reply)', value: seedSeconds, unit: 's' },
      ];
    } finally {
      store.close();
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
