/** freshRead: callers share reads, and never get one that began before they asked (common practice: request coalescing). */
import { describe, expect, it } from 'vitest';
import { freshRead } from '../../src/lib/db/fresh-read';

function deferred<T>() {
  let resolve!: (v: T) => void;
  let reject!: (e: unknown) => void;
  const promise = new Promise<T>((res, rej) => ((resolve = res), (reject = rej)));
  return { promise, resolve, reject };
}

describe('freshRead', () => {
  it('gives callers arriving during a read the next read, shared, and never the running one', async () => {
    const reads: ReturnType<typeof deferred<number>>[] = [];
    const read = freshRead(() => {
      const d = deferred<number>();
      reads.push(d);
      return d.promise;
    });
    const a = read();
    expect(reads).toHaveLength(1);
    const b = read();
    const c = read();
    expect(reads).toHaveLength(1); // b and c wait for the next read, not the running one
    reads[0]!.resolve(1);
    expect(await a).toBe(1);
    await new Promise((r) => setTimeout(r, 0));
    expect(reads).toHaveLength(2);
    reads[1]!.resolve(2);
    expect(await b).toBe(2);
    expect(await c).toBe(2);
    // Nothing is kept: a caller after the reads settled starts a new one.
    const d = read();
    expect(reads).toHaveLength(3);
    reads[2]!.resolve(3);
    expect(await d).toBe(3);
  });

  it('hands a failure only to the callers of that read', async () => {
    let n = 0;
    const read = freshRead(async () => {
      n++;
      await new Promise((r) => setTimeout(r, 5));
      if (n === 1) throw new Error('first read failed');
      return n;
    });
    const a = read();
    const b = read();
    await expect(a).rejects.toThrow('first read failed');
    expect(await b).toBe(2);
    expect(await read()).toBe(3);
  });
});
