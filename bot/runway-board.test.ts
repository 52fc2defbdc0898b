import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createBot } from './bot.js';
import { runwayBoard } from './runway-board.js';
import { openStore, type Store } from './store/index.js';

let dir: string;
let store: Store;
beforeEach(() => {
  dir = mkdtempSync(join(tmpdir(), 'tankrunway-board-'));
  store = openStore(join(dir, 'board.sqlite'));
});
afterEach(() => {
  store.close();
  rmSync(dir, { recursive: true, force: true });
});

describe('runwayBoard', () => {
  it('lists a team tanks shortest runway first, and only that team', async () => {
    const bot = createBot({ store });
    const now = Date.UTC(2026, 11, 2, 8);
    const day = 86_400_000;
    const send = (team: string, text: string, at: number) =>
      bot.handle({ team, channel: 'C1', user: 'U1', text, receivedAt: at });
    // Invented demo scenario: a slow tank (A1) and a fast one (B2) at Kestrel Valley.
    for (const code of ['A1', 'B2'])
      await send(
        'slack:T1',
        `add tank ${code} vertical-cylinder diameter=48in length=72in unit=gal`,
        now - 3 * day,
      );
    await send('slack:T1', 'A1 60in at 2026-11-29 08:00', now);
    await send('slack:T1', 'A1 59in', now);
    await send('slack:T1', 'B2 60in at 2026-11-29 08:00', now);
    await send('slack:T1', 'B2 40in', now);
    await send('slack:T2', 'add tank Z9 vertical-cylinder diameter=48in length=72in unit=gal', now);

    const board = runwayBoard(store, 'slack:T1', now);
    expect(board.table?.rows.map((r) => r[0])).toEqual(['B2', 'A1']);
    expect(runwayBoard(store, 'slack:T2', now).table?.rows.map((r) => r[0])).toEqual(['Z9']);
    expect(runwayBoard(store, 'slack:T3', now).headline).toMatch(/^No tanks yet/);
  });
});
