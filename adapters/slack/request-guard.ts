import type { IncomingMessage, RequestListener, ServerResponse } from 'node:http';

/**
 * Slack signs `v0:<timestamp>:<body>`; Bolt rejects timestamps older than five minutes but accepts any in the
 * future, so a captured request re-signed with a far-future clock would be replayable for as long as that clock
 * allows. We refuse a timestamp more than this far ahead of our clock (same tolerance Bolt uses for old ones).
 */
export const maxFutureSkewSeconds = 5 * 60;

/** True when the request carries a Slack timestamp too far in the future to be trusted. */
export function isFutureTimestamp(header: string | string[] | undefined, nowMs: number): boolean {
  const raw = Array.isArray(header) ? header[0] : header;
  if (raw === undefined) return false; // a missing header is Bolt's to reject (401)
  const seconds = Number(raw);
  if (!Number.isFinite(seconds)) return false; // malformed: Bolt rejects it with 401
  return seconds > Math.floor(nowMs / 1000) + maxFutureSkewSeconds;
}

/** Wraps a receiver's listener: future-dated requests get 401 before Bolt reads the body. */
export function rejectFutureRequests(
  inner: RequestListener,
  clock: () => number = Date.now,
): RequestListener {
  return (req: IncomingMessage, res: ServerResponse) => {
    if (isFutureTimestamp(req.headers['x-slack-request-timestamp'], clock())) {
      req.resume(); // drain the body so the socket can be reused
      res.writeHead(401).end();
      return;
    }
    inner(req, res);
  };
}
