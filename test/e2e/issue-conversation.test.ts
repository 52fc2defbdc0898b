// The conversation of the bot's issue, verbatim, through the real console (`tankrunway chat`, piped).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { factOf, replyBlocks, runChat } from './chat-process.js';

const CONVERSATION = [
  'add tank T4 vertical-cylinder diameter=48in length=72in unit=gal',
  'T4 60in at 2026-11-02 07:30',
  'T4 52.3in at 2026-11-05 08:10',
  'delivered 150 gal to T4 at 2026-11-06 10:00',
  'T4 61.2in at 2026-11-09 07:45',
  'T4?',
  'undo',
  'all',
];

let dir: string;
let blocks: string[];
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tr-issue-'));
  const run = await runChat(
    ['--db', join(dir, 't.sqlite'), '--user', 'ann', '--now', '2026-11-09T16:00Z'],
    CONVERSATION,
  );
  expect(run.stderr).toBe('');
  blocks = replyBlocks(run.stdout);
}, 60_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('the issue’s conversation through the console', () => {
  it('answers every message in order, one reply block each (the question adds its chart path)', () => {
    expect(blocks).toHaveLength(CONVERSATION.length);
    expect(blocks[0]).toMatch(/^Added T4: holds 564 gal/);
    expect(blocks[1]).toMatch(/^T4: 60 in = 470 gal \(83%\)/);
    expect(blocks[3]).toMatch(/^Delivery logged: T4 \+150 gal/);
  });

  it('names the volume in gal, the rate per day and the runway in days with its range', () => {
    const answer = blocks[5];
    expect(factOf(answer, 'Volume')).toMatch(/^479 gal \(85%\)$/);
    expect(factOf(answer, 'Use')).toMatch(
      /^[\d.]+ gal\/day \([\d.]+-[\d.]+\), from 3 readings over 7\.0 days$/,
    );
    expect(factOf(answer, 'Runway')).toMatch(/^\d+ days \(\d+-\d+\) to empty, /);
    expect(answer).toMatch(/Chart: .*\.png/);
  });

  it('undoes the last reading and lists the tank without it', () => {
    expect(blocks[6]).toMatch(/^Undone: the reading "T4 61.2in at 2026-11-09 07:45"/);
    expect(blocks[7]).toMatch(/^1 tank/);
    expect(blocks[7]).toMatch(/T4 +410 gal +73%/);
  });
});
