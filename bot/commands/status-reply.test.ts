import { describe, expect, it } from 'vitest';
import { factOf, useBotSession } from '../../test/support/bot-session.js';
import { formatPercent, formatVolume } from '../replies/format.js';
import { toPlainText } from '../replies/plainText.js';

const TEAM = 'console:kestrel';
const DAY = 86_400_000;
const session = useBotSession({ team: TEAM, start: '2026-11-20T16:00:00Z' });
const { say } = session;
const fact = factOf;
const statusOf = (code: string) => session.statusOf(code);

/** T4 falling about an inch a day for six days, then a reading in the wrong unit kept as typed. */
async function t4WithUnconfirmedReading(): Promise<void> {
  await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal');
  for (const [i, level] of [60, 59, 58, 57.1, 56, 55].entries()) {
    await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
  }
  await say('T4 54cm at 2026-11-16 08:00');
  await say('no');
}

describe('an unconfirmed latest reading', () => {
  it('shows the volume the estimate trusts, with the unconfirmed reading beside it, in every figure', async () => {
    await t4WithUnconfirmedReading();
    const s = statusOf('T4');
    expect(s.latest?.suspect).toBeDefined();
    const trusted = formatVolume(s.rate!.volume, 'gal');
    const unconfirmed = formatVolume(s.latest!.volume, 'gal');
    expect(trusted).not.toBe(unconfirmed);
    const percent = formatPercent(s.rate!.volume / s.capacity);

    const [answer] = await say('T4?');
    expect(answer?.headline).toMatch(new RegExp(`^T4: ${trusted} \\(${percent}\\)`));
    expect(fact(answer, 'Volume')).toBe(
      `${trusted} (${percent}); latest reading ${unconfirmed} not confirmed yet`,
    );
    // The unconfirmed volume is never given as the tank's volume.
    expect(answer?.headline).not.toMatch(new RegExp(`^T4: ${unconfirmed}`));

    const [all] = await say('all');
    expect(all?.table?.rows[0]?.[2]).toBe(`${trusted}*`);
    expect(all?.table?.rows[0]?.[3]).toBe(percent);
  });

  it('a confirmed latest reading is the volume, with no note', async () => {
    await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal');
    for (const [i, level] of [60, 59, 58].entries()) await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
    const s = statusOf('T4');
    const [answer] = await say('T4?');
    expect(fact(answer, 'Volume')).toBe(
      `${formatVolume(s.latest!.volume, 'gal')} (${formatPercent(s.latest!.fraction)})`,
    );
  });
});

describe('a runway that is already over', () => {
  it('says the tank is at its threshold now with the verdict, never a past date as the future', async () => {
    await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal');
    await say('set T4 threshold 50%');
    for (const [i, level] of [40, 36, 32, 28, 24].entries())
      await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
    const [answer] = await say('T4?');
    const runway = fact(answer, 'Runway');
    expect(runway).toMatch(/^over: at or below the threshold \(\d[\d,]* gal\) now/);
    expect(answer?.headline).toMatch(/runway over: at or below the threshold .* now; order now/);
    expect(toPlainText(answer!)).not.toMatch(/0 hours/);
    const [all] = await say('all');
    expect(all?.table?.rows[0]?.[4]).toBe('over');
  });

  it('a run-out instant in the past reads as empty now by the forecast', async () => {
    await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal');
    for (const [i, level] of [20, 16, 12, 8].entries()) await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
    session.clock = Date.parse('2026-11-13T08:00:00Z') + 5 * DAY;
    const [answer] = await say('T4?');
    const runway = fact(answer, 'Runway') ?? '';
    expect(runway).toMatch(/^over: empty now by the forecast/);
    // No date is shown as if it were still ahead.
    expect(runway).not.toMatch(/\d{1,2} Nov/);
  });
});

describe('a refill quantity', () => {
  it('comes with the note to gauge the tank before filling', async () => {
    await say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal');
    await say('set T4 threshold 50%');
    for (const [i, level] of [40, 36, 32, 28, 24].entries())
      await say(`T4 ${level}in at 2026-11-${10 + i} 08:00`);
    const [answer] = await say('T4?');
    const refill = fact(answer, 'Refill') ?? '';
    expect(refill).toMatch(/about [\d,]+ gal to reach the safe fill level/);
    expect(refill).toMatch(/gauge the tank before filling/);
  });
});

describe('the chart of a filling (waste) tank', () => {
  it('marks a pick-up nobody logged, from the readings', async () => {
    await say('add tank W2 rectangular width=2m length=3m height=1.5m unit=L product="backwash waste"');
    const levels = [20, 30, 40, 50, 60, 70, 80, 15, 25, 35, 45];
    for (const [i, level] of levels.entries())
      await say(`W2 ${level}cm at 2026-11-${String(5 + i).padStart(2, '0')} 08:00`);
    await say('delivered 3000 L to W2 at 2026-11-16 09:00');
    const [answer] = await say('W2?');
    const chart = answer?.chart;
    expect(chart?.filling).toBe(true);
    // The runway names the same line the chart draws.
    await say('set W2 threshold 80%');
    const [again] = await say('W2?');
    expect(fact(again, 'Runway')).toMatch(/to the pick-up level \([\d,]+ L\)/);
    expect(chart?.deliveries).toHaveLength(1);
    // The drop between the 11th and the 12th was never logged: it still gets its marker.
    expect(chart?.detected).toHaveLength(1);
    const detected = chart?.detected?.[0];
    expect(detected!.time).toBeGreaterThanOrEqual(Date.parse('2026-11-11T00:00:00Z'));
    expect(detected!.time).toBeLessThanOrEqual(Date.parse('2026-11-12T23:00:00Z'));
    // 65 cm over 2 m x 3 m is 3,900 L; the estimate is the rise it cut short, about that much.
    expect(detected!.volume).toBeGreaterThan(3000);
    expect(detected!.volume).toBeLessThan(5000);
  });
});
