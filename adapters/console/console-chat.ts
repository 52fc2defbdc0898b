import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import type { Readable, Writable } from 'node:stream';
import type { Bot } from '../../bot/bot.js';
import { toPlainText } from '../../bot/replies/plainText.js';
import { renderChartPng } from '../../bot/replies/renderChart.js';
import type { LevelChart, Reply } from '../../bot/replies/reply.js';
import { parseClockLine } from './clock-line.js';

export interface ConsoleChatOptions {
  bot: Bot;
  /** Team id as the bot sees it, e.g. "console:local". */
  team: string;
  user: string;
  input: Readable;
  output: Pick<Writable, 'write'>;
  /** true on a terminal: prompt and line editing; false for scripts: one message a line, plain replies. */
  interactive: boolean;
  /** Where chart PNGs are written (created on first use). */
  chartsDir: string;
  /** The adapter's clock (the bot reads none); scripts may move it with a `/now ...` line. */
  clock: () => number;
  /** Called with the console's time after each line (the scheduler prints digests and notices due by then). */
  afterLine?: (now: number) => Promise<void>;
}

/** A file name that is safe on every OS: the chart title's letters and digits, then the instant. */
function chartFileName(chart: LevelChart, at: number): string {
  const slug =
    chart.title
      .replace(/[^\p{L}\p{N}]+/gu, '-')
      .replace(/^-|-$/g, '')
      .slice(0, 40) || 'tank';
  return `${slug}-${new Date(at).toISOString().replace(/[:.]/g, '-')}.png`;
}

/** Renders a reply for the terminal, saving its chart (if any) and adding the path to the text. */
async function replyText(reply: Reply, options: ConsoleChatOptions, at: number): Promise<string> {
  // One block per reply: a blank line only ever separates replies, so a script can split on it.
  let text = toPlainText(reply).replace(/\n(\s*\n)+/g, '\n');
  if (reply.chart) {
    try {
      const png = await renderChartPng(reply.chart);
      mkdirSync(options.chartsDir, { recursive: true });
      const path = join(options.chartsDir, chartFileName(reply.chart, at));
      writeFileSync(path, png);
      text += `\nChart: ${path}`;
    } catch (error) {
      // A chart is a bonus: the numbers above it stand on their own.
      text += `\n(chart not saved: ${error instanceof Error ? error.message : String(error)})`;
    }
  }
  return text;
}

/**
 * The terminal chat: each line is one message to the bot, and each reply is printed as plain text followed
 * by a blank line. Lines are handled strictly one after another, so a script's order is the store's order.
 */
export async function runConsoleChat(options: ConsoleChatOptions): Promise<void> {
  const { output } = options;
  const lines = createInterface({
    input: options.input,
    ...(options.interactive ? { output: output as Writable, prompt: '> ' } : {}),
    crlfDelay: Number.POSITIVE_INFINITY,
    terminal: options.interactive,
  });
  let offset = 0;
  const now = () => options.clock() + offset;
  if (options.interactive) lines.prompt();
  for await (const raw of lines) {
    const text = raw.trim();
    if (text === '' || text.startsWith('#')) {
      if (options.interactive) lines.prompt();
      continue;
    }
    const clock = parseClockLine(text);
    if (clock) {
      if (clock.ok) {
        offset = clock.value - options.clock();
        output.write(`Clock set to ${new Date(clock.value).toISOString()}\n\n`);
      } else {
        output.write(`${clock.error}\n\n`);
      }
      await options.afterLine?.(now());
      if (options.interactive) lines.prompt();
      continue;
    }
    if (options.interactive && (text === 'quit' || text === 'exit')) break;
    const at = now();
    const replies = await options.bot.handle({
      team: options.team,
      channel: 'console',
      user: options.user,
      userName: options.user,
      text: raw,
      receivedAt: at,
    });
    for (const reply of replies) output.write(`${await replyText(reply, options, at)}\n\n`);
    await options.afterLine?.(now());
    if (options.interactive) lines.prompt();
  }
  lines.close();
}
