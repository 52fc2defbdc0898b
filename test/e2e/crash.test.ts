// Crash safety: SIGKILL the console while it logs a stream of readings; after a restart every reading it
// confirmed is in the store, and nothing is half-written (each reading has its audit row, the file checks).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openStore } from '../../bot/store/index.js';
import { replyBlocks, runChat, startChat } from './chat-process.js';

const READINGS = 3000;
const KILL_AFTER = 60;

/** A slowly falling level, one reading every 10 minutes from 2 Nov 2026 00:00 UTC. */
function readingLine(i: number): string {
  const at = new Date(Date.UTC(2026, 10, 2) + i * 600_000).toISOString().slice(0, 16).replace('T', ' ');
  return `T4 ${(70 - i * 0.01).toFixed(2)}in at ${at}`;
}

let dir: string;
let db: string;
let confirmed: string[];
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'tr-crash-'));
  db = join(dir, 'team.sqlite');
  const now = ['--now', '2026-12-31T00:00Z'];
  const setup = await runChat(
    ['--db', db, '--user', 'ann', ...now],
    ['add tank T4 vertical-cylinder diameter=48in length=72in unit=gal'],
  );
  expect(setup.code).toBe(0);

  const child = startChat(['--db', db, '--user', 'ann', ...now]);
  confirmed = [];
  let out = '';
  await new Promise<void>((resolve) => {
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => {
      out += chunk;
      const seen = (out.match(/^T4: .* = .*$/gm) ?? []).length;
      if (seen >= KILL_AFTER && !child.killed) child.kill('SIGKILL');
    });
    child.on('close', () => resolve());
    // The whole stream is offered at once; the process reads and commits it line by line.
    child.stdin.on('error', () => {}); // the pipe breaks when the process dies mid-write
    child.stdin.write(`${Array.from({ length: READINGS }, (_, i) => readingLine(i)).join('\n')}\n`);
  });
  // A reply is printed only after its transaction committed: every complete confirmation counts.
  const complete = out.slice(0, out.lastIndexOf('\n\n') + 1);
  confirmed = replyBlocks(complete)
    .filter((b) => /^T4: .* = /.test(b))
    .map((b) => /Read at: +(.*)$/m.exec(b)?.[1] ?? '');
}, 120_000);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('SIGKILL mid-stream of readings', () => {
  it('was killed part-way, after the confirmations it printed', () => {
    expect(confirmed.length).toBeGreaterThanOrEqual(KILL_AFTER);
    expect(confirmed.length).toBeLessThan(READINGS);
  });

  it('keeps every confirmed reading and writes nothing by halves', () => {
    const store = openStore(db);
    try {
      expect(store.db.pragma('integrity_check', { simple: true })).toBe('ok');
      const tank = store.tanks.byCode('console:local', 'T4')!;
      const rows = store.readings.forTank('console:local', tank.id, { includeHeld: true });
      expect(rows.length).toBeGreaterThanOrEqual(confirmed.length);
      // The readings stored are exactly the first N lines of the stream, each with its own audit entry.
      expect(rows.map((r) => r.rawText)).toEqual(
        Array.from({ length: rows.length }, (_, i) => readingLine(i)),
      );
      const audited = store.db
        .prepare("SELECT COUNT(*) AS n FROM audit WHERE action = 'reading.add' AND team_id = 'console:local'")
        .get() as { n: number };
      expect(audited.n).toBe(rows.length);
    } finally {
      store.close();
    }
  });

  it('restarts on the same file and answers from it', async () => {
    const run = await runChat(['--db', db, '--user', 'ann', '--now', '2026-12-31T00:00Z'], ['T4?']);
    expect(run.code).toBe(0);
    expect(run.stdout).toMatch(/^T4: .* gal \(\d+%\), runway /m);
  });
});
