import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { runConsoleChat } from './console-chat.js';
import { consoleSchedule } from './console-schedule.js';

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-console-schedule-'));
  store = openStore(join(dir, 'bot.sqlite'));
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

/** Runs a piped console script with the scheduler attached, as `tankrunway chat` does. */
async function chat(lines: string[], start: number): Promise<{ out: string; log: string[] }> {
  let out = '';
  const log: string[] = [];
  const output = {
    write: (chunk: string) => {
      out += chunk;
      return true;
    },
  };
  const schedule = consoleSchedule({ store, output, clock: () => start, log: (l) => log.push(l) });
  await runConsoleChat({
    bot: createBot({ store }),
    team: 'console:local',
    user: 'ann',
    input: Readable.from([`${lines.join('\n')}\n`]),
    output,
    interactive: false,
    chartsDir: join(dir, 'charts'),
    clock: () => start,
    afterLine: schedule.afterLine,
  }).finally(schedule.stop);
  return { out, log };
}

describe('the console shows digests and notices as they fire', () => {
  it('prints one morning digest per day as the script clock passes 07:00 local, and `digest now` on demand', async () => {
    const { out } = await chat(
      [
        'set time zone America/Chicago',
        'set digest 07:00 weekdays here',
        'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
        'T4 60in at 2026-11-02 07:30',
        'T4 52.3in at 2026-11-05 08:10',
        '/now 2026-11-09T13:05Z', // Monday 07:05 CST: the day's digest is due
        'T4 50in',
        '/now 2026-11-09T20:00Z', // later that day: no second one
        'digest now',
        '/now 2026-11-10T13:00Z', // Tuesday 07:00 CST
      ],
      Date.parse('2026-11-09T06:00:00Z'),
    );
    const banners = out.match(/\[morning digest to #console\]/g) ?? [];
    expect(banners).toHaveLength(2);
    const first = out.indexOf('[morning digest to #console]');
    expect(out.indexOf('Clock set to 2026-11-09T13:05:00.000Z')).toBeLessThan(first);
    // T4's last reading is four days old: the digest says so, and the daily reminder follows.
    expect(out.slice(first)).toMatch(
      /^\[morning digest to #console\]\nMorning digest, Mon 9 Nov: 1 thing needs attention\./,
    );
    expect(out).toContain('Overdue readings:  T4: last read 4 days ago');
    expect(out).toMatch(/\[reminder to #console\]\nT4 has had no reading for 4 days/);
    // `digest now` answers with the same digest model, without a banner (it is a reply, not a post).
    expect(out).toMatch(/\n\n(Morning digest|All clear)[^\n]*Mon 9 Nov[^\n]*\n/);
    expect(out).toContain('T4');
  });

  it('prints nothing scheduled for a team with no digest channel', async () => {
    const { out, log } = await chat(
      ['add tank T4 vertical-cylinder diameter=48in length=72in unit=gal', '/now 2026-11-10T13:00Z'],
      Date.parse('2026-11-09T06:00:00Z'),
    );
    expect(out).not.toContain('[morning digest');
    expect(log).toEqual([]);
  });
});
