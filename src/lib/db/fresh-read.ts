/**
 * Shares one database read among callers that ask at the same moment, without ever answering
 * from the past: a caller gets the result of a read that started after it asked. While a read is
 * running, later callers wait for the next one, which starts as soon as the running one ends and
 * serves all of them. Under load, N concurrent requests cost about one round trip each way instead
 * of N, and each still sees what PostgreSQL held after it arrived, whichever instance wrote it.
 * Nothing is kept after a read settles (a failure reaches only its own callers).
 */
export function freshRead<T>(read: () => Promise<T>): () => Promise<T> {
  let running: Promise<T> | null = null;
  let next: Promise<T> | null = null;
  const start = (): Promise<T> => {
    const p = read();
    running = p;
    const done = () => {
      if (running === p) running = null;
    };
    p.then(done, done);
    return p;
  };
  return () => {
    if (!running) return start();
    next ??= running
      .then(
        () => undefined,
        () => undefined,
      )
      .then(() => {
        next = null;
        return start();
      });
    return next;
  };
}
