/**
 * Runs jobs one after another, each starting in its own turn of the event loop (setImmediate). The bot's
 * work is synchronous SQLite and arithmetic on the one thread that also reads the gateway: taking one job
 * per turn lets pending network events (new interactions, their acknowledgements) in between, so a burst
 * of interactions is acknowledged within Discord's 3 s while the answers follow.
 */
export interface OneAtATime {
  run<T>(job: () => Promise<T>): Promise<T>;
  /** Jobs waiting or running. */
  readonly pending: number;
}

export function oneAtATime(): OneAtATime {
  let tail: Promise<unknown> = Promise.resolve();
  let pending = 0;
  return {
    get pending() {
      return pending;
    },
    run<T>(job: () => Promise<T>): Promise<T> {
      pending++;
      const result = tail.then(
        () =>
          new Promise<T>((resolve, reject) => {
            setImmediate(() => {
              job().then(resolve, reject);
            });
          }),
      );
      const settled = result.finally(() => {
        pending--;
      });
      // A failed job must not stop the ones behind it.
      tail = settled.catch(() => undefined);
      return result;
    },
  };
}
