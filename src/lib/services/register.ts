/**
 * The public register: list, one entry, verify the chain, streamed CSV and GeoJSON exports,
 * corrections and appeal outcomes (new entries that name the one they supersede).
 */
import { stringify } from 'csv-stringify/sync';
import { recordAudit } from '../db/audit';
import { db, replica, withTransaction } from '../db/client';
import { freshRead } from '../db/fresh-read';
import { getBoardSettings } from '../db/meetings';
import * as store from '../db/register';
import { regionList, regionsOfVersion } from '../db/regions';
import * as blocks from '../db/register-blocks';
import { HttpError } from '../http/errors';
import { keptAnswer, type KeptAnswer } from '../http/kept-answer';
import { textStream, type Room } from '../http/text-stream';
import type { Caller } from '../http/handle';
import { ChainVerifier } from '../register/chain';
import { logger } from '../log.mjs';
import type { Condition, Outcome, RegisterContent } from '../register/content';

const VERIFY_BATCH = 5000;
const EXPORT_BATCH = 2000;

/** Entries per verified block (register_verified_block). */
export const VERIFY_BLOCK = 10_000;

/**
 * Recomputes the chain in one snapshot (REPEATABLE READ). Blocks of `blockSize` entries verified
 * in full before, whose rows PostgreSQL has not rewritten since (same row versions: db/register-blocks.ts), are
 * taken as checked; from the first block that is new or differs, every entry is hashed again, batch
 * by batch, the next batch read while this one is hashed. When the whole chain holds, the complete
 * blocks just hashed are recorded with their digests for the next verify.
 */
export async function verifyRegister(blockSize = VERIFY_BLOCK) {
  return db.transaction(
    async (trx) => {
      const v = new ChainVerifier();
      const stored = await blocks.storedBlocks(trx, blockSize);
      const prefix = stored.filter((b, i) => b.first === i * blockSize + 1);
      let after = 0;
      if (prefix.length) {
        const now = await blocks.blockDigests(trx, blockSize, 1, prefix.at(-1)!.last);
        for (const [i, b] of prefix.entries()) {
          const c = now[i];
          if (
            !c ||
            c.first !== b.first ||
            c.last !== b.last ||
            c.n !== blockSize ||
            c.digest !== b.digest ||
            c.lastHash !== b.lastHash
          )
            break;
          v.skip(blockSize, b.last, b.lastHash);
          after = b.last;
        }
      }
      let next = store.chainBatch(trx, after, VERIFY_BATCH);
      for (;;) {
        const rows = await next;
        const full = rows.length === VERIFY_BATCH;
        if (full) next = store.chainBatch(trx, rows[rows.length - 1]!.seq, VERIFY_BATCH);
        for (const r of rows) v.add(r);
        if (!full) break;
      }
      const result = v.result();
      const complete = Math.floor(result.entries / blockSize) * blockSize;
      if (result.ok && complete > after)
        await blocks.saveBlocks(trx, await blocks.blockDigests(trx, blockSize, after + 1, complete));
      return { ...result, checkedAt: new Date().toISOString() };
    },
    { isolationLevel: 'repeatable read' },
  );
}

/**
 * The scheduled check (job `register-check`): the same verify as the public route, run in the
 * background so the blocks that hold are recorded before anyone asks; a broken chain is logged as
 * an error and audited, naming the first broken entry.
 */
export async function checkRegisterChain(): Promise<{ ok: boolean; entries: number; firstBrokenEntry: number | null }> {
  const r = await verifyRegister();
  const out = { ok: r.ok, entries: r.entries, firstBrokenEntry: r.firstBrokenEntry };
  if (!r.ok) {
    logger.error(out, 'the register chain is broken');
    await withTransaction(db, (trx) =>
      recordAudit(trx, {
        actorId: null,
        action: 'job.register-check',
        entityType: 'job',
        entityId: 'register-check',
        details: out,
      }),
    );
  }
  return out;
}

export async function registerHead() {
  const h = await store.head(replica);
  return { headSeq: h?.seq ?? 0, headHash: h?.hash ?? null };
}

function summary(r: store.ListRow) {
  const c = r.summary as unknown as Omit<RegisterContent, 'parcels'> & { parcelReferences: string[] };
  return {
    seq: r.seq,
    hash: r.hash,
    kind: c.kind,
    reference: c.proposal.reference,
    title: c.proposal.title,
    proposedUse: c.proposal.proposedUse,
    outcome: c.outcome,
    decidedOn: c.decidedOn,
    effectiveDate: c.effectiveDate,
    areaHa: c.areaHa,
    region: c.region,
    riskLevel: c.risk.level,
    riskLabel: c.risk.label,
    co2eTotal: c.figures.co2eTotal,
    co2eLow: c.figures.co2eLow,
    co2eHigh: c.figures.co2eHigh,
    parcelReferences: c.parcelReferences,
    conditions: c.conditions.length,
    supersedesSeq: r.supersedes_seq,
    supersededBy: r.superseded_by,
  };
}

export type ListQuery = store.RegisterFilter & { sort: string; dir: 'asc' | 'desc'; page: number; pageSize: number };

/** Regions of one published region layer version: the version's features never change, so they are kept by version id. */
const regionsByVersion = new Map<string, Promise<{ key: string; label: string }[]>>();

async function regionsOf(versionId: number | null): Promise<{ key: string; label: string }[]> {
  if (versionId === null) return (await regionList(replica)).regions;
  return remember(regionsByVersion, 20, String(versionId), () => regionsOfVersion(replica, versionId));
}

/**
 * The region filter takes a region's key or its name (any case; a name's start is enough when
 * only one region's name starts so, e.g. "fenbrook" for "Fenbrook district").
 */
export async function regionKeyOf(region: string | undefined, versionId?: number | null): Promise<string | undefined> {
  if (!region) return region;
  const regions = versionId === undefined ? (await regionList(replica)).regions : await regionsOf(versionId);
  const want = region.trim().toLowerCase();
  const exact = regions.find((r) => r.key.toLowerCase() === want || r.label.toLowerCase() === want);
  if (exact) return exact.key;
  const starts = regions.filter((r) => r.label.toLowerCase().startsWith(want));
  return starts.length === 1 ? starts[0]!.key : region;
}

/** Key → name of each accounting region of the current layer (for showing names instead of keys). */
export async function regionNames(): Promise<Record<string, string>> {
  return Object.fromEntries((await regionList(replica)).regions.map((r) => [r.key, r.label]));
}

/**
 * Counts and whole pages of the list, by head hash and query. Entries never change and every
 * append makes a new head, and a list reads the register as it stood at its head, so what is kept
 * for one head is a fixed fact, whichever instance computed it: bounded caches, not shared state.
 */
const COUNT_CACHE_MAX = 2000;
const PAGE_CACHE_MAX = 300;
const counts = new Map<string, Promise<number>>();
const pages = new Map<string, Promise<ReturnType<typeof summary>[]>>();

/** The promise is kept, so clients asking for the same thing at once share one query; a failure is not kept. */
function remember<T>(cache: Map<string, Promise<T>>, max: number, key: string, make: () => Promise<T>): Promise<T> {
  const known = cache.get(key);
  if (known) return known;
  if (cache.size >= max) cache.delete(cache.keys().next().value!);
  const p = make();
  cache.set(key, p);
  p.catch(() => cache.delete(key));
  return p;
}

const filterKey = (f: store.RegisterFilter) => [
  f.outcome,
  f.year,
  f.risk,
  f.areaMin,
  f.areaMax,
  f.region,
  f.q,
  f.current,
];

function countAt(f: store.RegisterFilter, head: { seq: number; hash: string }): Promise<number> {
  return remember(counts, COUNT_CACHE_MAX, `${head.hash}|${JSON.stringify(filterKey(f))}`, () =>
    store.countEntries(replica, f, head.seq),
  );
}

function pageAt(q: ListQuery, head: { seq: number; hash: string }) {
  const key = `${head.hash}|${JSON.stringify([...filterKey(q), q.sort, q.dir, q.page, q.pageSize])}`;
  return remember(pages, PAGE_CACHE_MAX, key, async () => (await store.listEntries(replica, q, head.seq)).map(summary));
}

/**
 * The head and region layer a list reads: shared by the requests that ask at the same moment, each
 * getting a read that began after it arrived (db/fresh-read.ts), so a list never shows a head older
 * than the request, on any instance (on a replica: older only by the replica's lag).
 */
const currentListState = freshRead(() => store.listState(replica));

export async function listRegister(query: ListQuery) {
  const state = await currentListState();
  return listAt(query, state);
}

async function listAt(query: ListQuery, state: store.ListState) {
  const h = state.head;
  const q = { ...query, region: await regionKeyOf(query.region, state.regionVersionId) };
  if (!h) return { items: [], total: 0, page: q.page, pageSize: q.pageSize, headSeq: 0, headHash: null };
  const [items, total] = await Promise.all([pageAt(q, h), countAt(q, h)]);
  return { items, total, page: q.page, pageSize: q.pageSize, headSeq: h.seq, headHash: h.hash };
}

const BODY_CACHE_MAX = 300;
const bodies = new Map<string, Promise<KeptAnswer>>();
const utf8 = new TextEncoder();

/**
 * The list as the JSON text of the API's answer (UTF-8 bytes, with an ETag and compressed copies:
 * http/kept-answer.ts). One round trip, shared with the requests arriving at the same moment, reads
 * the head and the current region layer; an answer already made for that head, layer and query is
 * sent as it was made (the same fixed fact as the cached pages), so a busy public list costs little
 * more than a ping.
 */
export async function listRegisterJson(query: ListQuery): Promise<KeptAnswer> {
  const state = await currentListState();
  const filters = [...filterKey(query), query.sort, query.dir, query.page, query.pageSize];
  const key = `${state.head?.hash ?? '-'}|${state.regionVersionId ?? '-'}|${JSON.stringify(filters)}`;
  return remember(bodies, BODY_CACHE_MAX, key, async () =>
    keptAnswer(utf8.encode(JSON.stringify(await listAt(query, state))), key),
  );
}

/** Each member's vote on the entry's decision, only when the authority publishes them (setting register.votes-public); else null. */
async function publicMemberVotes(seq: number) {
  if (!(await getBoardSettings(replica))['register.votes-public']) return null;
  return store.memberVotes(replica, seq);
}

export async function registerEntry(seq: number) {
  const r = await store.getEntry(replica, seq);
  if (!r) throw new HttpError('NOT_FOUND', `The register has no entry ${seq}.`);
  return {
    seq: r.seq,
    hash: r.hash,
    prevHash: r.prev_hash,
    supersedesSeq: r.supersedes_seq,
    supersededBy: r.superseded_by,
    createdAt: r.created_at.toISOString(),
    content: r.content as RegisterContent,
    memberVotes: await publicMemberVotes(seq),
    ...(await registerHead()),
  };
}

/** Rows of the filtered register in seq order, batch by batch (flat memory however long the register); the next batch is read while this one is written out. */
async function* filteredRows(f: store.RegisterFilter) {
  const { where, args } = store.filterSql({ ...f, region: await regionKeyOf(f.region) });
  yield* readAhead((after) => store.batchAfter(replica, after, EXPORT_BATCH, where, args));
}

/** Keyset batches in seq order; the next batch is read while this one is written out. */
async function* readAhead<T extends { seq: number }>(read: (afterSeq: number) => Promise<T[]>) {
  const batch = (after: number) => {
    const p = read(after);
    p.catch(() => {}); // a read ahead that fails after the client went away must not crash the process; awaited, it still throws
    return p;
  };
  let next = batch(0);
  for (;;) {
    const rows = await next;
    const full = rows.length === EXPORT_BATCH;
    if (full) next = batch(rows[rows.length - 1]!.seq);
    yield rows;
    if (!full) return;
  }
}

export const CSV_COLUMNS = [
  'seq',
  'hash',
  'kind',
  'reference',
  'title',
  'proposed_use',
  'outcome',
  'decided_on',
  'effective_date',
  'appeal_until',
  'parcels',
  'area_ha',
  'region',
  'risk_level',
  'risk_label',
  'co2e_t',
  'co2e_low_t',
  'co2e_high_t',
  'gwp',
  'factor_set',
  'rule_set',
  'meeting_date',
  'conditions',
  'reasons',
  'supersedes_seq',
  'superseded_by',
] as const;

/** The CSV columns are read by PostgreSQL straight from the stored content (db/register.ts `csvBatchAfter`), so no entry is parsed here. */
export function registerCsv(f: store.RegisterFilter, room?: Room): ReadableStream<Uint8Array> {
  return textStream(
    (async function* () {
      yield stringify([[...CSV_COLUMNS]]);
      const { where, args } = store.filterSql({ ...f, region: await regionKeyOf(f.region) });
      for await (const rows of readAhead((after) => store.csvBatchAfter(replica, after, EXPORT_BATCH, where, args)))
        if (rows.length) yield stringify(rows.map((r) => CSV_COLUMNS.map((c) => r[c] ?? '')));
    })(),
    room,
  );
}

/** RFC 7946 FeatureCollection: one Feature per entry, its parcels as one MultiPolygon (WGS 84 lon/lat). */
export function registerGeoJson(f: store.RegisterFilter, room?: Room): ReadableStream<Uint8Array> {
  return textStream(
    (async function* () {
      yield '{"type":"FeatureCollection","features":[';
      let first = true;
      for await (const rows of filteredRows(f)) {
        if (!rows.length) continue;
        const features = rows.map((r) => {
          const c = r.content as RegisterContent;
          const { parcels, ...props } = c;
          return JSON.stringify({
            type: 'Feature',
            id: r.seq,
            geometry: { type: 'MultiPolygon', coordinates: parcels.flatMap((p) => p.geometry.coordinates) },
            properties: {
              seq: r.seq,
              hash: r.hash,
              supersededBy: r.superseded_by,
              parcelReferences: parcels.map((p) => p.reference),
              ...props,
            },
          });
        });
        yield (first ? '' : ',') + features.join(',');
        first = false;
      }
      yield ']}';
    })(),
    room,
  );
}

export type CorrectionInput = {
  kind: 'correction' | 'appeal-outcome';
  note: string;
  outcome?: Outcome;
  reasons?: string;
  conditions?: Condition[];
  effectiveDate?: string;
};

/** A correction or appeal outcome: a new entry carrying the superseded one's content with the changes and a note (`now` dates it). */
export async function correctEntry(by: Caller, seq: number, input: CorrectionInput, now = new Date()) {
  return withTransaction(db, async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(?)', [0x5257_4b01]);
    const old = await store.getEntry(trx, seq);
    if (!old) throw new HttpError('NOT_FOUND', `The register has no entry ${seq}.`);
    if (old.superseded_by)
      throw new HttpError(
        'CONFLICT',
        `Entry ${seq} has already been superseded by entry ${old.superseded_by}; correct that one instead.`,
      );
    const c = old.content as RegisterContent;
    const outcome = input.outcome ?? c.outcome;
    const conditions = input.conditions ?? (outcome === 'approved-with-conditions' ? c.conditions : []);
    if (outcome === 'approved-with-conditions' && conditions.length === 0)
      throw new HttpError('UNPROCESSABLE_CONTENT', 'An approval with conditions needs at least one condition.', [
        { path: ['conditions'], message: 'at least one condition' },
      ]);
    if (outcome !== 'approved-with-conditions' && conditions.length)
      throw new HttpError('UNPROCESSABLE_CONTENT', 'Only an approval with conditions carries conditions.', [
        { path: ['conditions'], message: 'remove them or choose approved-with-conditions' },
      ]);
    const content: RegisterContent = {
      ...c,
      kind: input.kind,
      outcome,
      conditions,
      reasons: input.reasons ?? c.reasons,
      effectiveDate: input.effectiveDate ?? c.effectiveDate,
      decidedOn: now.toISOString().slice(0, 10),
      recordedAt: now.toISOString(),
      supersedes: seq,
      note: input.note,
    };
    const entry = await store.appendEntry(trx, content);
    await recordAudit(trx, {
      actorId: by.id,
      action: `register.${input.kind}`,
      entityType: 'register_entry',
      entityId: String(entry.seq),
      details: { supersedes: seq, outcome, hash: entry.hash },
    });
    return { seq: entry.seq, hash: entry.hash, supersedesSeq: seq, outcome };
  });
}

/** A public vector tile of the register's parcels; the ETag is the register head, so a new entry changes it on every instance. */
export async function registerTileResponse(
  request: Request,
  z: number,
  x: number,
  y: number,
  askedHead: number | undefined,
): Promise<Response> {
  const max = 2 ** z;
  if (x >= max || y >= max)
    throw new HttpError(
      'BAD_REQUEST',
      `Tile ${z}/${x}/${y} does not exist: x and y must be below ${max} at zoom ${z}.`,
    );
  const h = await registerHead();
  const etag = `"r${h.headSeq}-${(h.headHash ?? 'empty').slice(0, 16)}"`;
  // A URL naming the current head never changes (entries are append-only); other URLs revalidate.
  const headers = {
    etag,
    'cache-control': askedHead === h.headSeq ? 'public, max-age=86400, immutable' : 'public, no-cache',
  };
  if (request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
  const tile = await store.registerTile(replica, z, x, y);
  return new Response(tile as Uint8Array<ArrayBuffer>, {
    status: 200,
    headers: { ...headers, 'content-type': 'application/vnd.mapbox-vector-tile' },
  });
}
