/** A byte stream of UTF-8 text pieces from an async generator, pulled as the client reads (for streamed exports). */
export function textStream(parts: AsyncGenerator<string>): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  return new ReadableStream({
    async pull(controller) {
      const next = await parts.next();
      if (next.done) controller.close();
      else controller.enqueue(enc.encode(next.value));
    },
    async cancel() {
      await parts.return(undefined);
    },
  });
}
