import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createBot } from '../../bot/bot.js';
import { openStore, type Store } from '../../bot/store/index.js';
import { parseClockLine } from './clock-line.js';
import { runConsoleChat } from './console-chat.js';

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-console-'));
  store = openStore(join(dir, 'bot.sqlite'));
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

async function chat(lines: string[], start = Date.parse('2026-11-09T16:00:00Z')): Promise<string> {
  let out = '';
  await runConsoleChat({
    bot: createBot({ store }),
    team: 'console:local',
    user: 'ann',
    input: Readable.from([`${lines.join('\n')}\n`]),
    output: {
      write: (chunk: string) => {
        out += chunk;
        return true;
      },
    },
    interactive: false,
    chartsDir: join(dir, 'charts'),
    clock: () => start,
  });
  return out;
}

describe('runConsoleChat (piped)', () => {
  it('prints each reply as plain text followed by a blank line, skipping blanks and # comments', async () => {
    const out = await chat([
      '# a comment',
      '',
      'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
      'T4 60in at 2026-11-02 07:30',
    ]);
    const blocks = out.split('\n\n').filter((b) => b.trim() !== '');
    expect(blocks[0]).toMatch(/^Added T4/);
    expect(blocks.some((b) => b.startsWith('T4: 60 in = 470 gal (83%)'))).toBe(true);
    expect(out.endsWith('\n\n')).toBe(true);
    expect(out).not.toContain('a comment');
  });

  it('moves its clock on a /now line, so a script can replay days', async () => {
    const out = await chat([
      'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
      '/now 2026-11-02T08:00Z',
      'T4 60in at 7:30',
      '/now tomorrow',
    ]);
    expect(out).toContain('Clock set to 2026-11-02T08:00:00.000Z');
    expect(out).toContain('Read at:  Mon 2 Nov 2026 07:30');
    expect(out).toMatch(/To set the console clock/);
  });

  it('saves a question’s chart as a PNG next to the store and prints its path', async () => {
    const out = await chat([
      'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
      'T4 60in at 2026-11-02 07:30',
      'T4 52.3in at 2026-11-05 08:10',
      'T4?',
    ]);
    const path = /Chart: (\S+\.png)/.exec(out)?.[1];
    expect(path).toBeDefined();
    expect(path!.startsWith(join(dir, 'charts'))).toBe(true);
    expect(existsSync(path!)).toBe(true);
  });
});

describe('parseClockLine', () => {
  it('reads ISO instants, offsets and zone names, and leaves other lines to the bot', () => {
    expect(parseClockLine('/now 2026-11-02T08:00Z')).toEqual({
      ok: true,
      value: Date.parse('2026-11-02T08:00Z'),
    });
    expect(parseClockLine('/now 2026-11-02T08:00-06:00')).toEqual({
      ok: true,
      value: Date.parse('2026-11-02T14:00Z'),
    });
    expect(parseClockLine('/now 2026-11-02T08:00 America/Chicago')).toEqual({
      ok: true,
      value: Date.parse('2026-11-02T14:00Z'),
    });
    expect(parseClockLine('/now 2026-11-02T08:00 Mars/Olympus')?.ok).toBe(false);
    expect(parseClockLine('/now')?.ok).toBe(false);
    expect(parseClockLine('T4 60in')).toBeUndefined();
  });
});
