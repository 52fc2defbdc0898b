// Builds requests exactly as Slack sends them: HMAC-SHA256 over `v0:<timestamp>:<raw body>` with the signing
// secret (Slack's documented request-signing scheme), POSTed to Bolt's /slack/events.
import { createHmac } from 'node:crypto';

export interface SignedPostOptions {
  secret: string;
  /** Seconds since the epoch; now by default. */
  timestamp?: number;
  retryNum?: number;
  /** Overrides the computed signature (forgeries). */
  signature?: string;
}

export function slackSignature(secret: string, timestamp: number, body: string): string {
  return `v0=${createHmac('sha256', secret).update(`v0:${timestamp}:${body}`).digest('hex')}`;
}

export async function postSigned(
  url: string,
  body: string,
  contentType: 'application/x-www-form-urlencoded' | 'application/json',
  options: SignedPostOptions,
): Promise<{ status: number; text: string }> {
  const timestamp = options.timestamp ?? Math.floor(Date.now() / 1000);
  const headers: Record<string, string> = {
    'content-type': contentType,
    'x-slack-request-timestamp': String(timestamp),
    'x-slack-signature': options.signature ?? slackSignature(options.secret, timestamp, body),
  };
  if (options.retryNum !== undefined) {
    headers['x-slack-retry-num'] = String(options.retryNum);
    headers['x-slack-retry-reason'] = 'http_timeout';
  }
  const res = await fetch(url, { method: 'POST', headers, body });
  return { status: res.status, text: await res.text() };
}

/** A slash command as Slack form-encodes it. */
export function slashCommandBody(fields: {
  command: string;
  text: string;
  team_id: string;
  channel_id: string;
  user_id: string;
  response_url: string;
  trigger_id: string;
}): string {
  return new URLSearchParams({
    ...fields,
    user_name: fields.user_id.toLowerCase(),
    api_app_id: 'A0TANK',
  }).toString();
}

/** An interactive payload (block_actions, view_submission) as Slack form-encodes it. */
export function interactionBody(payload: object): string {
  return new URLSearchParams({ payload: JSON.stringify(payload) }).toString();
}
