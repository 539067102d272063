/**
 * Verified blocks of the register chain (table register_verified_block). A block's digest is the
 * SHA-256 of each row's seq, hashes and row version as PostgreSQL keeps it (xmin: the transaction
 * that wrote the row; ctid: where it lies). Any change to a row, even by the database owner with the
 * trigger switched off, writes a new row version, so the digest changes and verify hashes that block
 * again in full; a table rewrite (VACUUM FULL, a restore) changes it too and costs one full verify.
 * Reading row versions instead of the contents keeps a repeat verify of 100,000 entries short.
 */
import type { Db } from './client';

export type BlockDigest = { first: number; last: number; n: number; lastHash: string; digest: string };

/** The text every digest is taken of: one line per entry (seq, hashes, row version), in seq order. */
const DIGEST =
  `encode(sha256(convert_to(string_agg(seq::text || ' ' || prev_hash || ' ' || hash || ' ' || ` +
  `xmin::text || ' ' || ctid::text, E'\\n' order by seq), 'UTF8')), 'hex')`;

/** Stored blocks of `size` entries aligned on multiples of it (1..size, size+1..2 size, ...), in order. */
export async function storedBlocks(db: Db, size: number): Promise<BlockDigest[]> {
  const r = await db.raw(
    `select first_seq::float8 as first, last_seq::float8 as last, last_hash, digest from register_verified_block
     where last_seq - first_seq + 1 = ? and (first_seq - 1) % ? = 0 order by first_seq`,
    [size, size],
  );
  return r.rows.map((x: { first: number; last: number; last_hash: string; digest: string }) => ({
    first: x.first,
    last: x.last,
    n: size,
    lastHash: x.last_hash,
    digest: x.digest,
  }));
}

/** Digests of the blocks of `size` entries between `from` and `to` (both block edges), as the rows are now. */
export async function blockDigests(db: Db, size: number, from: number, to: number): Promise<BlockDigest[]> {
  const r = await db.raw(
    `select min(seq)::float8 as first, max(seq)::float8 as last, count(*)::int as n, (array_agg(hash order by seq desc))[1] as last_hash, ${DIGEST} as digest
     from register_entry where seq between ? and ? group by (seq - 1) / ? order by 1`,
    [from, to, size],
  );
  return r.rows.map((x: { first: number; last: number; n: number; last_hash: string; digest: string }) => ({
    first: x.first,
    last: x.last,
    n: x.n,
    lastHash: x.last_hash,
    digest: x.digest,
  }));
}

export async function saveBlocks(db: Db, blocks: BlockDigest[]): Promise<void> {
  if (!blocks.length) return;
  await db('register_verified_block')
    .insert(
      blocks.map((b) => ({
        first_seq: b.first,
        last_seq: b.last,
        last_hash: b.lastHash,
        digest: b.digest,
        verified_at: db.fn.now(),
      })),
    )
    .onConflict(['first_seq', 'last_seq'])
    .merge();
}
