import { describe, expect, it } from 'vitest';
import { useBotSession } from '../../test/support/bot-session.js';

const TEAM = 'discord:81384788765712384';
const session = useBotSession({ team: TEAM, start: '2026-11-09T16:00:00Z', channel: 'ops', stepMs: 60_000 });
const { say } = session;
const tankT4 = () => say('add tank T4 vertical-cylinder diameter=48in length=72in unit=gal product=diesel');

describe('command handlers', () => {
  it('sends help to the sender only, with examples', async () => {
    const [help] = await say('help');
    expect(help).toMatchObject({ kind: 'help', visibility: 'sender' });
    expect(help?.table?.rows.some((r) => r[1] === 'T4?')).toBe(true);
  });

  it('deletes a reading by its local clock time, in the team zone', async () => {
    await tankT4();
    await say('set time zone America/Chicago');
    await say('T4 60in at 2026-11-02 07:30');
    await say('T4 58in at 2026-11-03 07:45');
    const [deleted] = await say('delete the 7:30 reading');
    expect(deleted?.headline).toMatch(/Deleted the reading "T4 60in at 2026-11-02 07:30"/);
    const rows = session.store.readings.forTank(TEAM, session.store.tanks.byCode(TEAM, 'T4')!.id);
    expect(rows.map((r) => r.value)).toEqual([58]);
    expect((await say('delete the 6:15 reading'))[0]?.kind).toBe('error');
  });

  it('renames and removes tanks, keeping history', async () => {
    await tankT4();
    await say('T4 60in');
    expect((await say('rename T4 to GEN-1'))[0]?.headline).toBe('T4 is now GEN-1.');
    expect((await say('GEN-1?'))[0]?.kind).toBe('answer');
    expect((await say('T4?'))[0]?.kind).toBe('error');
    expect((await say('remove tank GEN-1'))[0]?.headline).toMatch(/^Removed GEN-1/);
    expect(session.store.tanks.list(TEAM)).toEqual([]);
    expect((session.store.db.prepare('SELECT COUNT(*) AS n FROM readings').get() as { n: number }).n).toBe(1);
  });

  it('keeps team settings: zone (checked) and digest', async () => {
    await tankT4();
    expect((await say('set time zone Mars/Olympus'))[0]?.kind).toBe('error');
    await say('set time zone Europe/Paris');
    await say('set digest 07:00 weekdays here');
    expect(session.store.teams.get(TEAM)).toMatchObject({
      timeZone: 'Europe/Paris',
      digestTime: '07:00',
      digestDays: [1, 2, 3, 4, 5],
      digestChannel: 'ops',
    });
    const audit = session.store.audit.recent(TEAM, 5).map((a) => a.action);
    expect(audit).toContain('settings.team');
  });

  it('stores tank settings in the engine’s units and plans with them', async () => {
    await tankT4();
    await say('set T4 threshold 100 gal');
    await say('set T4 lead time 3 business days');
    const tank = session.store.tanks.byCode(TEAM, 'T4')!;
    // 100 US gal = 378.5411784 L (NIST Handbook 44, appendix C: 1 gal = 231 in^3 exactly).
    expect(tank.settings).toMatchObject({ leadTimeDays: 3, businessDays: true });
    expect((tank.settings.threshold as { volume: number }).volume).toBeCloseTo(378.5411784, 9);
    await say('T4 30in at 2026-11-02 07:30');
    await say('T4 20in at 2026-11-06 07:30');
    const [answer] = await say('T4?');
    // By the forecast the tank passed 100 gal early on Nov 9, before this question: the runway says so.
    expect(answer?.facts?.find((f) => f.label === 'Runway')?.value).toMatch(
      /^over: at or below the threshold \(100 gal\) now/,
    );
    expect(answer?.facts?.find((f) => f.label === 'Refill')?.value).not.toMatch(/default threshold/);
  });

  it('keeps the hours a delivery arrives in, and plans to the window', async () => {
    await tankT4();
    await say('set time zone America/Chicago');
    await say('set T4 delivery days tue,thu');
    const [saved] = await say('set T4 delivery hours 8am to noon');
    expect(saved?.headline).toMatch(/deliveries arrive between 08:00 and 12:00/);
    expect(session.store.tanks.byCode(TEAM, 'T4')!.settings.deliveryHours).toEqual([8, 12]);
    expect((await say('set T4 delivery hours noon-8'))[0]?.kind).toBe('error');
    expect(session.store.tanks.byCode(TEAM, 'T4')!.settings.deliveryHours).toEqual([8, 12]);
  });

  it('lists the tanks that run low this week', async () => {
    await tankT4();
    await say('add tank T5 vertical-cylinder diameter=48in length=72in unit=gal');
    await say('T4 30in at 2026-11-02 07:30');
    await say('T4 20in at 2026-11-06 07:30');
    await say('T5 70in at 2026-11-02 07:30');
    await say('T5 69.9in at 2026-11-06 07:30');
    const [low] = await say('which tanks run low this week?');
    expect(low?.headline).toMatch(/^1 tank runs low this week: T4$/);
  });

  it('cancels a pending exchange, and says so when there is none', async () => {
    await say('add tank T9 strapping unit=L');
    expect((await say('cancel'))[0]?.headline).toMatch(/^Cancelled/);
    expect(session.store.pending.get(TEAM, 'ops', 'ann')).toBeUndefined();
    expect(session.store.tanks.list(TEAM)).toEqual([]);
  });

  it('composes the digest on demand', async () => {
    await tankT4();
    await say('T4 60in');
    const [digest] = await say('digest now');
    expect(digest?.kind).toBe('digest');
  });

  it('confirms a delivery with the delivery caution, and refuses one that cannot fit', async () => {
    await tankT4();
    const [delivery] = await say('delivered 100 gal to T4 ticket 8812');
    expect(delivery?.caution).toMatch(/room left in the tank/);
    expect(delivery?.facts?.find((f) => f.label === 'Ticket')?.value).toBe('8812');
    expect((await say('delivered 600 gal to T4'))[0]?.kind).toBe('error');
  });
});
