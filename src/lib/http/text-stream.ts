/**
 * Waits until the client's connection has room for more (scripts/serve.mjs puts one in
 * `locals.room`); undefined when there is room now or outside that server.
 */
export type Room = () => Promise<void> | undefined;

/**
 * A byte stream of UTF-8 text pieces from an async generator, pulled as the client reads (for
 * streamed exports). Astro writes a response body as fast as it is made, whatever the client
 * reads, so a long export asks `room` before making each next piece: memory stays flat however
 * slow the client.
 */
export function textStream(parts: AsyncGenerator<string>, room?: Room): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  return new ReadableStream({
    async pull(controller) {
      await room?.();
      const next = await parts.next();
      if (next.done) controller.close();
      else controller.enqueue(enc.encode(next.value));
    },
    async cancel() {
      await parts.return(undefined);
    },
  });
}
