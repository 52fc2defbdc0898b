/**
 * Sends the bot's replies to Slack. Channel replies (readings, deliveries, answers, digests) are posted for
 * the whole channel; sender replies (errors, help) only to the person. A chart is uploaded with files.uploadV2
 * after its message. `respond` (the interaction's response_url) is used when there is one: it works in
 * channels the app was not invited to.
 */
import type { Logger, webApi } from '@slack/bolt';
import type { LevelChart, Reply } from '../../bot/replies/reply.js';
import { toSlackMessage } from './blocks.js';
import type { TeamClients } from './team-clients.js';

export type RespondFn = (message: {
  response_type: 'in_channel' | 'ephemeral';
  replace_original: false;
  text: string;
  blocks?: ReturnType<typeof toSlackMessage>['blocks'];
}) => Promise<unknown>;

export interface Destination {
  /** Slack team id (without our prefix). */
  teamId: string;
  /** Channel, or a user id to post in the app's direct messages. */
  channel: string;
  /** The sender, for sender-only replies. */
  user?: string;
  threadTs?: string;
  respond?: RespondFn;
}

export interface Outbox {
  send(to: Destination, replies: Reply[]): Promise<void>;
}

export type ChartRenderer = (chart: LevelChart) => Promise<Buffer>;

const chartMissing =
  'The chart could not be posted in this channel. Invite the app to the channel (`/invite @tankrunway`) to get charts here.';

export function createOutbox(clients: TeamClients, renderChart: ChartRenderer, logger: Logger): Outbox {
  async function tellSender(to: Destination, client: webApi.WebClient, text: string): Promise<void> {
    try {
      if (to.respond) await to.respond({ response_type: 'ephemeral', replace_original: false, text });
      else if (to.user) await client.chat.postEphemeral({ channel: to.channel, user: to.user, text });
    } catch (error) {
      logger.warn(`could not tell the sender: ${String(error)}`);
    }
  }

  async function uploadChart(to: Destination, chart: LevelChart): Promise<void> {
    const png = await renderChart(chart);
    const file = {
      file: png,
      filename: 'runway.png',
      title: chart.title,
      alt_text: `${chart.title}: level history and forecast`,
    };
    const client = clients.forTeam(to.teamId);
    if (to.threadTs) await client.filesUploadV2({ ...file, channel_id: to.channel, thread_ts: to.threadTs });
    else await client.filesUploadV2({ ...file, channel_id: to.channel });
  }

  async function sendOne(to: Destination, reply: Reply): Promise<void> {
    const message = toSlackMessage(reply);
    const toChannel = reply.visibility === 'channel' || to.user === undefined;
    const thread = to.threadTs ? { thread_ts: to.threadTs } : {};
    const client = clients.forTeam(to.teamId);
    if (to.respond) {
      await to.respond({
        response_type: toChannel ? 'in_channel' : 'ephemeral',
        replace_original: false,
        ...message,
      });
    } else if (toChannel) {
      await client.chat.postMessage({ channel: to.channel, ...thread, ...message });
    } else {
      await client.chat.postEphemeral({
        channel: to.channel,
        user: to.user as string,
        ...thread,
        ...message,
      });
    }
    // A file can only be shared with the whole channel, so a sender-only reply keeps its chart to itself.
    if (reply.chart && toChannel) {
      try {
        await uploadChart(to, reply.chart);
      } catch (error) {
        // The numbers are already posted; a chart is a bonus. Usually the app is not in the channel.
        logger.warn(`chart upload to ${to.channel} failed: ${String(error)}`);
        await tellSender(to, client, chartMissing);
      }
    }
  }

  return {
    async send(to, replies) {
      // In order: a confirmation should not land after the question it answers.
      for (const reply of replies) await sendOne(to, reply);
    },
  };
}
