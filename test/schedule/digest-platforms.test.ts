// The digest must fit one message on each platform by its own cutting ("and N more"), so the adapters never
// have to chop it mid-word. Limits: ../shared/docs/chat-platforms.md (Slack: text under 4,000 characters,
// 50 blocks; Discord: 6,000 characters across an embed, 25 fields, 1,024 per field value, 256 per title).
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { replyEmbed } from '../../adapters/discord/embed.js';
import { toSlackMessage } from '../../adapters/slack/blocks.js';
import { composeDigest } from '../../bot/schedule/digest.js';
import type { Store } from '../../bot/store/index.js';
import { type TankStatus, tankStatus } from '../../bot/tank-status.js';
import { type TempStore, tempStore } from './helpers.js';

const DAY = 86_400_000;
const NOW = Date.parse('2026-12-02T13:00:00Z');
const TEAM = 'console:kestrel';
const drum = { units: { length: 'in', volume: 'gal' }, shape: 'vertical-cylinder', diameter: 48, length: 72 };

let temp: TempStore;
let store: Store;
beforeEach(() => {
  temp = tempStore();
  store = temp.open();
  store.teams.ensure(TEAM, NOW - 60 * DAY, { timeZone: 'America/Chicago' });
});
afterEach(() => temp.cleanup());

/** Many tanks, most needing an order today, at many sites, a few long-unread: every section is long. */
function busyStatuses(count: number): TankStatus[] {
  const ids: number[] = [];
  store.transaction(() => {
    for (let i = 0; i < count; i++) {
      const id = store.tanks.add(
        TEAM,
        {
          code: `KV-${String(i).padStart(3, '0')}`,
          name: `Kestrel Valley booster tank number ${i}`,
          site: `Kestrel Valley pumping site ${i % 9}`,
          product: i % 2 ? 'diesel' : 'sodium hypochlorite 12.5%',
          spec: drum,
          settings: { threshold: { percent: 40 }, leadTimeDays: 5 },
        },
        'u1',
        NOW - 60 * DAY,
      ).id;
      const last = i % 5 === 0 ? NOW - 6 * DAY : NOW - DAY;
      for (let d = 0; d < 4; d++) {
        const time = last - (3 - d) * DAY;
        const value = 300 - 20 * d;
        store.readings.add(
          TEAM,
          { tankId: id, time, kind: 'volume', value, unit: 'gal', rawText: `${value} gal`, userId: 'u1' },
          time,
        );
      }
      ids.push(id);
    }
  });
  return ids.map((id) => tankStatus(store, TEAM, id, NOW)!);
}

describe('a long digest on each platform', () => {
  it('fits Slack and Discord without the adapters cutting anything', () => {
    const reply = composeDigest({
      teamName: 'Kestrel Valley Water Co-op',
      timeZone: 'America/Chicago',
      demo: true,
      now: NOW,
      since: NOW - DAY,
      statuses: busyStatuses(60),
    });

    const slack = toSlackMessage(reply);
    expect(slack.text.length).toBeLessThan(4000);
    expect(slack.blocks.length).toBeLessThanOrEqual(50);
    expect(JSON.stringify(slack.blocks)).not.toContain('…');
    expect(slack.text).not.toContain('…');

    const embed = replyEmbed(reply);
    const size =
      (embed.title?.length ?? 0) +
      (embed.description?.length ?? 0) +
      (embed.fields ?? []).reduce((n, f) => n + f.name.length + f.value.length, 0);
    expect(size).toBeLessThanOrEqual(6000);
    expect((embed.fields ?? []).length).toBeLessThanOrEqual(25);
    expect(JSON.stringify(embed)).not.toContain('…');
    // Every section the digest has reached the embed, each ending in its own count of what was left out.
    expect((embed.fields ?? []).map((f) => f.name)).toEqual(
      expect.arrayContaining(['Order today', 'Overdue readings', 'Caution']),
    );
    expect(embed.description).toMatch(/and \d+ more/);
  });
});
