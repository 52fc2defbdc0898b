/**
 * The morning digest as one Reply that fits one message on every platform: Slack (text under 4,000
 * characters, 50 blocks) and Discord (2,000 characters of content, 6,000 across embeds, 25 fields, 1,024 per
 * field) - limits from ../shared/docs/chat-platforms.md. Lists are cut with "and N more" until the plain-text
 * form, the strictest of those, fits.
 */
import { cautionFor } from '../replies/cautions.js';
import { formatDate } from '../replies/format.js';
import { toPlainText } from '../replies/plainText.js';
import type { Fact, Reply } from '../replies/reply.js';
import type { Store } from '../store/open-store.js';
import type { Team } from '../store/types.js';
import type { TankStatus } from '../tank-status.js';
import {
  byRunway,
  deliveryLines,
  dropLines,
  dueToday,
  endOfLocalDay,
  overdueLines,
  problemLines,
  runwayRow,
} from './digest-sections.js';
import { digestStatuses } from './digest-statuses.js';
import { postsRepo } from './posts.js';
import { siteOrders } from './site-orders.js';

/** The plain-text budget: under Discord's 2,000-character message with room for a mention or a link. */
export const DIGEST_MAX_CHARS = 1_900;
/** The runway table never shows more rows than this: the tanks nearest their threshold. */
const MOST_ROWS = 15;
const DAY = 86_400_000;

export interface DigestInput {
  teamName: string | null;
  timeZone: string;
  demo: boolean;
  now: number;
  /** Deliveries and drops after this instant are news (the previous digest; a day back when none). */
  since: number;
  statuses: readonly TankStatus[];
}

interface Sections {
  /** Tank statuses sorted by runway; only the rows shown are formatted (formatting is the costly part). */
  table: readonly TankStatus[];
  /** The first rows, formatted once and reused while the fit shrinks the table. */
  firstRows: string[][];
  orders: string[];
  /** Said once beside the orders: gauge before filling, as the answers say beside a quantity. */
  ordersNote: string | undefined;
  drops: string[];
  problems: string[];
  overdue: string[];
  deliveries: string[];
}

/** Keeps `max` items and says how many were left out. */
function cut(lines: readonly string[], max: number): string[] {
  if (lines.length <= max) return [...lines];
  const kept = lines.slice(0, Math.max(0, max));
  return [...kept, `and ${lines.length - kept.length} more`];
}

function build(
  input: DigestInput,
  s: Sections,
  caution: string | undefined,
  endOfDay: number,
  rows: number,
  items: number,
): Reply {
  const attention = s.orders.length + s.drops.length + s.problems.length + s.overdue.length;
  const day = formatDate(input.now, input.timeZone, input.now);
  const who = input.teamName ? ` for ${input.teamName}` : '';
  const demo = input.demo ? ' (DEMO DATA)' : '';
  const count = input.statuses.length;
  const headline =
    attention === 0
      ? `All clear${who}, ${day}${demo}: nothing to order today, no overdue readings, no unexplained drops (${count} ${count === 1 ? 'tank' : 'tanks'}).`
      : `Morning digest${who}, ${day}${demo}: ${attention} ${attention === 1 ? 'thing needs' : 'things need'} attention.`;
  const facts: Fact[] = [];
  const add = (label: string, lines: string[]) => {
    if (lines.length > 0) facts.push({ label, value: cut(lines, items).join('; ') });
  };
  if (s.orders.length > 0) {
    const note = s.ordersNote ? ` (${s.ordersNote})` : '';
    facts.push({ label: 'Order today', value: `${cut(s.orders, items).join('; ')}${note}` });
  }
  if (s.drops.length > 0) {
    facts.push({
      label: 'Unexplained drops',
      value: `${cut(s.drops, items).join('; ')} (possible leak or theft: check the tank, log any use)`,
    });
  }
  add('Check', s.problems);
  add('Overdue readings', s.overdue);
  add('Deliveries since the last digest', s.deliveries);
  const shown = s.table
    .slice(0, rows)
    .map((status, i) => s.firstRows[i] ?? runwayRow(status, input.now, input.timeZone, endOfDay));
  const table = s.table.length
    ? {
        columns: ['Tank', 'Site', 'Level', 'Runway', 'Action'],
        rows:
          s.table.length > rows ? [...shown, [`and ${s.table.length - rows} more`, '', '', '', '']] : shown,
      }
    : undefined;
  return {
    kind: 'digest',
    visibility: 'channel',
    headline,
    ...(facts.length ? { facts } : {}),
    ...(table ? { table } : {}),
    ...(caution ? { caution } : {}),
  };
}

/** Brief cautions for the hazardous tanks that need action today (at most two, deduplicated). */
function cautionsFor(input: DigestInput, due: readonly TankStatus[]): string | undefined {
  const texts = new Set<string>();
  for (const s of input.statuses) {
    if (s.overSafeFill) texts.add(cautionFor(s.tank.product ?? undefined, 'overfill') ?? '');
  }
  for (const s of due) texts.add(cautionFor(s.tank.product ?? undefined, 'low') ?? '');
  texts.delete('');
  // Each caution ends with the same deferral to local codes: say every sentence once.
  const sentences = new Set([...texts].slice(0, 2).flatMap((t) => t.split(/(?<=\.)\s+/)));
  return sentences.size ? [...sentences].join(' ') : undefined;
}

export function composeDigest(input: DigestInput): Reply {
  const zone = input.timeZone;
  const endOfDay = endOfLocalDay(input.now, zone);
  const due = dueToday(input.statuses, input.now, zone, endOfDay); // the zone's arithmetic once a team
  const sorted = byRunway(input.statuses);
  const orders = siteOrders(input.statuses, input.now, endOfDay);
  const sections: Sections = {
    table: sorted,
    firstRows: sorted.slice(0, MOST_ROWS).map((status) => runwayRow(status, input.now, zone, endOfDay)),
    orders: orders.lines,
    ordersNote: orders.note,
    drops: dropLines(input.statuses, input.since, input.now, zone),
    problems: problemLines(input.statuses),
    overdue: overdueLines(input.statuses, input.now),
    deliveries: deliveryLines(input.statuses, input.since, input.now, zone),
  };
  const caution = cautionsFor(input, due);
  // Shrink the lists step by step until the plain text fits; the last step always fits in practice.
  const steps: [number, number][] = [
    [MOST_ROWS, 6],
    [10, 4],
    [6, 3],
    [3, 2],
    [1, 1],
    [0, 0],
  ];
  let reply: Reply | undefined;
  for (const [rows, items] of steps) {
    reply = build(input, sections, caution, endOfDay, rows, items);
    if (toPlainText(reply).length <= DIGEST_MAX_CHARS) return reply;
  }
  return reply!;
}

/** The digest of a team from the store: every live tank's status at `now`. */
export function digestFromStore(store: Store, team: Team, now: number, since: number | null): Reply {
  const statuses = digestStatuses(store, team.id, now);
  return composeDigest({
    teamName: team.name,
    timeZone: team.timeZone,
    demo: team.demo,
    now,
    since: since ?? now - DAY,
    statuses,
  });
}

/**
 * The digest on demand (`digest now`): as the next scheduled one would read at `now`, with news since the
 * last digest delivered to the team's channel (a day back when there was none). Claims nothing.
 */
export function previewDigest(store: Store, team: Team, now: number): Reply {
  const channel = team.digestChannel;
  const since = channel ? postsRepo(store.db).lastDigestDueAt(team.id, channel) : null;
  return digestFromStore(store, team, now, since);
}
