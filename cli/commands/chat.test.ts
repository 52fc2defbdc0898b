import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openStore } from '../../bot/store/index.js';
import { main } from '../main.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tr-chat-cli-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function chat(args: string[], lines: string[] = []) {
  let stdout = '';
  let stderr = '';
  const code = await main(['chat', ...args], {
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
    stdin: Readable.from(lines.length ? [`${lines.join('\n')}\n`] : []),
  });
  return { code, stdout, stderr };
}

describe('tankrunway chat', () => {
  it('needs --db, a real time zone and a real instant: exit 2 with one line on stderr', async () => {
    for (const args of [
      [],
      ['--db', join(dir, 'a.sqlite'), '--time-zone', 'Mars/Olympus'],
      ['--db', join(dir, 'a.sqlite'), '--now', 'soon'],
      ['--db', join(dir, 'a.sqlite'), '--colour'],
    ]) {
      const run = await chat(args);
      expect(run.code).toBe(2);
      expect(run.stderr.trim().split('\n')).toHaveLength(1);
    }
  });

  it('seeds the demo only into an empty store, and the first user is the admin', async () => {
    const db = join(dir, 'demo.sqlite');
    const first = await chat(['--db', db, '--demo', '--user', 'ann', '--now', '2026-11-09T16:00Z'], ['all']);
    expect(first.code).toBe(0);
    expect(first.stdout).toMatch(/Loaded the demo team "Kestrel Valley Water Co-op" \(DEMO DATA/);
    expect(first.stdout).toMatch(/^4 tanks.*\[DEMO DATA\]/m);
    const again = await chat(
      ['--db', db, '--demo', '--user', 'bob', '--now', '2026-11-10T16:00Z'],
      ['add tank X1 sphere diameter=2m unit=L'],
    );
    expect(again.stdout).not.toMatch(/Loaded the demo team/);
    expect(again.stdout).toMatch(/Only a team admin can change tanks/);
    const store = openStore(db);
    try {
      expect(store.tanks.list('console:local')).toHaveLength(4);
    } finally {
      store.close();
    }
  });

  it('starts a new team in the --time-zone given, UTC otherwise', async () => {
    const db = join(dir, 'zone.sqlite');
    const run = await chat(
      ['--db', db, '--user', 'ann', '--time-zone', 'Europe/Paris', '--now', '2026-11-09T16:00Z'],
      ['all'],
    );
    expect(run.code).toBe(0);
    const store = openStore(db);
    try {
      expect(store.teams.get('console:local')?.timeZone).toBe('Europe/Paris');
    } finally {
      store.close();
    }
  });
});
