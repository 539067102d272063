/**
 * The register's hash chain (pure). Each entry's hash is the SHA-256 of the RFC 8785 canonical
 * JSON of { content, prevHash, seq }; prevHash is the hash of the entry before it, 64 zeros for
 * the first. Anyone holding the entries can recompute the chain with the same three lines.
 */
import { canonicalSha256 } from '../canonical-json';

export const GENESIS_HASH = '0'.repeat(64);

export function entryHash(seq: number, prevHash: string, content: unknown): string {
  return canonicalSha256({ content, prevHash, seq });
}

export type StoredEntry = { seq: number; prev_hash: string; hash: string; content: unknown };

/** Walks the chain in seq order; keeps only what is needed to continue, so it runs over any number of batches. */
export class ChainVerifier {
  entries = 0;
  firstBrokenEntry: number | null = null;
  problem: string | null = null;
  private expectedSeq = 1;
  private prevHash = GENESIS_HASH;

  add(e: StoredEntry): void {
    this.entries++;
    if (this.firstBrokenEntry === null) {
      const why =
        e.seq !== this.expectedSeq
          ? `entry ${e.seq} follows ${this.expectedSeq - 1}: an entry is missing`
          : e.prev_hash !== this.prevHash
            ? `entry ${e.seq} does not name the hash of entry ${e.seq - 1}`
            : entryHash(e.seq, e.prev_hash, e.content) !== e.hash
              ? `the content of entry ${e.seq} does not match its hash`
              : null;
      if (why) {
        this.firstBrokenEntry = e.seq;
        this.problem = why;
      }
    }
    this.expectedSeq = e.seq + 1;
    this.prevHash = e.hash;
  }

  /**
   * Takes a block already verified in full (entries up to `lastSeq`, the last one hashing to
   * `lastHash`) as checked, when its rows are known to be unchanged since.
   */
  skip(entries: number, lastSeq: number, lastHash: string): void {
    if (this.firstBrokenEntry !== null || lastSeq - entries + 1 !== this.expectedSeq)
      throw new Error('a verified block must follow the entries checked so far');
    this.entries += entries;
    this.expectedSeq = lastSeq + 1;
    this.prevHash = lastHash;
  }

  result(): {
    ok: boolean;
    entries: number;
    firstBrokenEntry: number | null;
    problem: string | null;
    headHash: string | null;
  } {
    return {
      ok: this.firstBrokenEntry === null,
      entries: this.entries,
      firstBrokenEntry: this.firstBrokenEntry,
      problem: this.problem,
      headHash: this.entries ? this.prevHash : null,
    };
  }
}
