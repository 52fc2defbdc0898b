/**
 * Replies -> Discord message payloads, one per reply, with the chart rendered to an attached PNG. A chart
 * that fails to render leaves its message without an image rather than losing the reply.
 */
import type { APIActionRowComponent, APIButtonComponent, APIEmbed } from 'discord.js';
import { renderChartPng } from '../../bot/replies/renderChart.js';
import type { LevelChart, Reply } from '../../bot/replies/reply.js';
import { actionRows, replyEmbed } from './embed.js';

export interface DiscordMessage {
  embeds: APIEmbed[];
  files: { attachment: Buffer; name: string }[];
  components: APIActionRowComponent<APIButtonComponent>[];
  /** Only the sender should see it (interaction responses only; channel posts cannot be private). */
  ephemeral: boolean;
}

export type ChartRenderer = (chart: LevelChart) => Promise<Buffer>;

export async function toDiscordMessages(
  replies: readonly Reply[],
  renderChart: ChartRenderer = renderChartPng,
  onChartError: (error: unknown) => void = () => {},
): Promise<DiscordMessage[]> {
  return Promise.all(
    replies.map(async (reply, i) => {
      let files: DiscordMessage['files'] = [];
      if (reply.chart) {
        try {
          files = [{ attachment: await renderChart(reply.chart), name: `level-chart-${i + 1}.png` }];
        } catch (error) {
          onChartError(error);
        }
      }
      return {
        embeds: [replyEmbed(reply, files[0]?.name)],
        files,
        components: actionRows(reply),
        ephemeral: reply.visibility === 'sender',
      };
    }),
  );
}

/** Whether answering may need the chart renderer (cold start is most of a second): then defer first. */
export const needsChart = (replies: readonly Reply[]) => replies.some((r) => r.chart !== undefined);
