// The load both the test and the bench send: slash commands from many simulated teams at once, each signed
// as Slack signs it and POSTed to the running receiver. Shared so the bench measures what the test checks.

import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { Worker } from 'node:worker_threads';
import { App, HTTPReceiver, LogLevel } from '@slack/bolt';
import type { Bot } from '../../bot/bot.js';
import { command, commandFields, signingSecret } from './harness.js';
import { slashCommandBody } from './signed-request.js';
import type { WebApiStandIn } from './web-api-standin.js';

export interface LoadCommand {
  team: string;
  channel: string;
  user: string;
  text: string;
  id: string;
}

export interface LoadResult {
  /** Time from sending each request to its HTTP answer (the ack), ms, in send order. */
  ackMs: number[];
  statuses: number[];
  /** From the first send until every reply reached its response_url, ms. */
  allRepliedMs: number;
}

/** `teams` teams with `tanksPerTeam` tanks each; the tanks are named T1..Tn in every team. */
export const loadTeams = (teams: number) =>
  Array.from({ length: teams }, (_, i) => `T0LOAD${String(i).padStart(3, '0')}`);

/** Sets every team up through the bot (not timed): an admin and `tanks` vertical tanks. */
export async function setUpLoadTeams(bot: Bot, teams: string[], tanks: number, now: number): Promise<void> {
  for (const team of teams) {
    for (let t = 1; t <= tanks; t++) {
      const replies = await bot.handle({
        team: `slack:${team}`,
        channel: 'C0YARD',
        user: 'U0ADMIN',
        text: `add tank T${t} vertical-cylinder diameter=48in length=72in unit=gal product=water site="North Yard"`,
        receivedAt: now,
      });
      const error = replies.find((r) => r.kind === 'error');
      if (error) throw new Error(`load setup failed: ${error.headline}`);
    }
  }
}

/** One reading per tank, so arrival order cannot matter: every command logs a different tank. */
export function loadCommands(teams: string[], tanks: number): LoadCommand[] {
  return teams.flatMap((team, k) =>
    Array.from({ length: tanks }, (_, t) => ({
      team,
      channel: 'C0YARD',
      user: `U0OP${k}`,
      text: `T${t + 1} ${40 + t}in`,
      id: `load-${team}-${t}`,
    })),
  );
}

/** Sends every command at once from a worker thread; returns each request's time to its HTTP answer (the ack). */
function sendBurst(
  eventsUrl: string,
  commands: LoadCommand[],
  responseUrl: (id: string) => string,
): Promise<{ ms: number; status: number }[]> {
  const bodies = commands.map((c) => slashCommandBody(commandFields(c, responseUrl(c.id))));
  const worker = new Worker(new URL('./load-sender.mjs', import.meta.url), {
    workerData: { url: eventsUrl, secret: signingSecret, bodies },
  });
  return new Promise((resolve, reject) => {
    worker.once('message', (results: { ms: number; status: number }[]) => {
      resolve(results);
      void worker.terminate();
    });
    worker.once('error', reject);
  });
}

/** Fires every command at once and waits until each reply was posted to its response_url. */
export async function fireLoad(
  eventsUrl: string,
  api: WebApiStandIn,
  commands: LoadCommand[],
): Promise<LoadResult> {
  const start = performance.now();
  const results = await sendBurst(eventsUrl, commands, api.responseUrl);
  const ids = new Set(commands.map((c) => c.id));
  await api.waitFor(() => [...ids].every((id) => api.responses.some((r) => r.id === id)), 30_000);
  return {
    ackMs: results.map((r) => r.ms),
    statuses: results.map((r) => r.status),
    allRepliedMs: performance.now() - start,
  };
}

/** The baseline: the same signed requests to a Bolt app whose command handler only acks. */
export async function startBareBolt(
  api: WebApiStandIn,
): Promise<{ eventsUrl: string; stop(): Promise<void> }> {
  const receiver = new HTTPReceiver({ signingSecret, logLevel: LogLevel.ERROR });
  const app = new App({
    token: 'xoxb-bare',
    receiver,
    clientOptions: { slackApiUrl: api.apiUrl },
    logLevel: LogLevel.ERROR,
  });
  app.command(command, async ({ ack }) => {
    await ack();
  });
  const server = (await app.start({ port: 0, host: '127.0.0.1' })) as Server;
  const port = (server.address() as AddressInfo).port;
  return { eventsUrl: `http://127.0.0.1:${port}/slack/events`, stop: async () => void (await app.stop()) };
}

export async function fireAcksOnly(
  eventsUrl: string,
  commands: LoadCommand[],
  responseUrl: (id: string) => string,
): Promise<number[]> {
  return (await sendBurst(eventsUrl, commands, responseUrl)).map((r) => r.ms);
}
