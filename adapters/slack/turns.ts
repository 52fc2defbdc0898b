/**
 * The bot's work is synchronous (SQLite, the estimator), so a burst of commands handled back to back would
 * hold the event loop and delay the acks of the requests still arriving past Slack's 3 s. Jobs take turns:
 * one at a time, each started from setImmediate, so pending I/O (new requests and their acks) runs between
 * any two jobs.
 */
export type TakeTurn = <T>(job: () => T | Promise<T>) => Promise<T>;

export function createTurns(): TakeTurn {
  let tail: Promise<unknown> = Promise.resolve();
  return <T>(job: () => T | Promise<T>): Promise<T> => {
    const result = tail.then(() => new Promise<void>((resolve) => setImmediate(resolve))).then(job);
    tail = result.catch(() => undefined);
    return result;
  };
}
