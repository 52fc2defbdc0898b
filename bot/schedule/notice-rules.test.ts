import { describe, expect, it } from 'vitest';
import { factOf, useBotSession } from '../../test/support/bot-session.js';
import { gaugeFirstNote } from '../replies/cautions.js';
import { formatPercent, formatVolume } from '../replies/format.js';
import { noticeReply } from './notice-rules.js';

// Demo scenario of our own invention (Kestrel Valley Water Co-op).
const TEAM = 'console:kestrel';
const session = useBotSession({ team: TEAM, start: '2026-11-20T16:00:00Z' });
const { say } = session;
const fact = factOf;
const statusOf = (code: string) => session.statusOf(code);

async function addT4(levels: readonly number[]): Promise<void> {
  await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product=diesel');
  for (const [i, level] of levels.entries()) await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
}

describe('noticeReply', () => {
  it('shows the volume the answers show: the trusted one while the latest reading is unconfirmed', async () => {
    // Falling about an inch a day, then a reading in the wrong unit kept as typed.
    await addT4([60, 59, 58, 57.1, 56, 55]);
    await say('T4 54cm at 2026-11-16 08:00');
    await say('no');
    const s = statusOf('T4');
    expect(s.latest?.suspect).toBeDefined();
    const notice = noticeReply('limit', s);
    const trusted = formatVolume(s.rate!.volume, 'gal');
    const unconfirmed = formatVolume(s.latest!.volume, 'gal');
    expect(fact(notice, 'Volume')).toBe(
      `${trusted} (${formatPercent(s.rate!.volume / s.capacity)}); latest reading ${unconfirmed} not confirmed yet`,
    );
    const [answer] = await say('T4?');
    expect(fact(notice, 'Volume')).toBe(fact(answer, 'Volume'));
  });

  it('gives an order quantity with the note to gauge the tank first, and the fuel caution', async () => {
    await addT4([20, 17, 14, 11]);
    const s = statusOf('T4');
    expect(s.latest?.suspect).toBeUndefined();
    expect(s.refill?.quantity).not.toBeNull();
    const notice = noticeReply('limit', s);
    expect(fact(notice, 'Volume')).toBe(
      `${formatVolume(s.latest!.volume, 'gal')} (${formatPercent(s.latest!.fraction)})`,
    );
    expect(fact(notice, 'Order')).toBe(
      `${formatVolume(s.refill!.quantity!, 'gal')}; ${gaugeFirstNote('order')}`,
    );
    expect(notice.caution).toMatch(/local codes/);
  });
});
