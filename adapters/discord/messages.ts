/**
 * Replies -> Discord message payloads, one per reply, with the chart rendered to an attached PNG. A chart
 * that fails to render leaves its message without an image rather than losing the reply.
 */
import type { APIActionRowComponent, APIButtonComponent, APIEmbed } from 'discord.js';
import { formatVolume } from '../../bot/replies/format.js';
import { renderChartPng } from '../../bot/replies/renderChart.js';
import type { LevelChart, Reply } from '../../bot/replies/reply.js';
import { actionRows, replyEmbed, truncate } from './embed.js';

export interface DiscordMessage {
  embeds: APIEmbed[];
  /** `description` is the image's alt text, read out by screen readers. */
  files: { attachment: Buffer; name: string; description: string }[];
  components: APIActionRowComponent<APIButtonComponent>[];
  /** Only the sender should see it (interaction responses only; channel posts cannot be private). */
  ephemeral: boolean;
}

/** Alt text for the chart image (Discord allows 1,024 characters; ours stays short). */
export function chartAltText(chart: LevelChart): string {
  const last = chart.history[chart.history.length - 1];
  const now =
    last && Number.isFinite(last.volume) ? `, last ${formatVolume(last.volume, chart.volumeUnit)}` : '';
  const line =
    chart.threshold !== undefined && Number.isFinite(chart.threshold)
      ? `, reorder line at ${formatVolume(chart.threshold, chart.volumeUnit)}`
      : '';
  return truncate(
    `Level chart of ${chart.title}: measured volume${now}, forecast with its likely range${line}.`,
    1024,
  );
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
          files = [
            {
              attachment: await renderChart(reply.chart),
              name: `level-chart-${i + 1}.png`,
              description: chartAltText(reply.chart),
            },
          ];
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
