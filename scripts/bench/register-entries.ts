/**
 * Invented register entries for the benchmark, chained exactly as the app chains them: each hash
 * is `entryHash` (src/lib/register/chain.ts, SHA-256 of the RFC 8785 canonical JSON of
 * { content, prevHash, seq }) over the previous one, so `GET /api/register/verify` must say ok.
 * Written set-based (a few thousand rows per INSERT … SELECT FROM unnest) after the current head,
 * in one transaction that takes the append lock like `appendEntry`. Deterministic (seeded).
 */
import type { Knex } from 'knex';
import { entryHash, GENESIS_HASH } from '../../src/lib/register/chain';
import { round, type Outcome, type RegisterContent } from '../../src/lib/register/content';

const BATCH = 2000;
const APPEND_LOCK = 0x5257_4b01;
const REGIONS = [
  'bench-district-1',
  'bench-district-2',
  'bench-district-3',
  'bench-district-4',
  'bench-district-5',
  'bench-district-6',
];
const OUTCOMES: Outcome[] = ['approved', 'approved', 'approved-with-conditions', 'refused'];
const USES = [
  'cropland, long-term-cultivated, full, medium',
  'cropland, long-term-cultivated, reduced, medium',
  'cropland, long-term-cultivated, no-till, high-without-manure',
];
const LABELS = ['Routine', 'Closer look', 'Full review', 'Barred unless cleared'];

/** mulberry32: a small seeded generator (common practice for reproducible test data). */
function random(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function parcel(rnd: () => number, seq: number, k: number): RegisterContent['parcels'][number] {
  const [lon, lat] = [-16.4 + rnd() * 0.5, 28.1 + rnd() * 0.2];
  const [w, h] = [0.001 + rnd() * 0.002, 0.001 + rnd() * 0.002];
  const ring = [
    [lon, lat],
    [lon + w, lat],
    [lon + w, lat + h],
    [lon, lat + h],
    [lon, lat],
  ].map((p) => p.map((c) => round(c, 7)));
  return {
    reference: `BENCH-${String(seq).padStart(6, '0')}-${k + 1}`,
    areaHa: round(1 + rnd() * 20, 4),
    part: false,
    geometry: { type: 'MultiPolygon', coordinates: [[ring]] },
  };
}

function decision(rnd: () => number, seq: number): RegisterContent {
  const parcels = Array.from({ length: 1 + Math.floor(rnd() * 3) }, (_, k) => parcel(rnd, seq, k));
  const outcome = OUTCOMES[Math.floor(rnd() * OUTCOMES.length)]!;
  const level = 1 + Math.floor(rnd() * 4);
  const year = 2019 + Math.floor(rnd() * 8);
  const decidedOn = `${year}-${String(1 + Math.floor(rnd() * 12)).padStart(2, '0')}-${String(1 + Math.floor(rnd() * 28)).padStart(2, '0')}`;
  const co2e = round(50 + rnd() * 5000);
  return {
    kind: 'decision',
    proposal: {
      reference: `PR-B${String(seq).padStart(6, '0')}`,
      title: `Conversion of bench field block ${seq}`,
      proposedUse: USES[seq % USES.length]!,
      startYear: year + 1,
    },
    parcels,
    areaHa: round(
      parcels.reduce((s, p) => s + p.areaHa, 0),
      4,
    ),
    region: REGIONS[Math.floor(rnd() * REGIONS.length)]!,
    outcome,
    reasons:
      outcome === 'refused'
        ? 'The loss of soil carbon outweighs the benefit stated.'
        : 'Within the authority’s thresholds.',
    conditions:
      outcome === 'approved-with-conditions'
        ? [
            {
              text: 'Keep a 6 m grass margin along the watercourse.',
              dueDate: `${year + 1}-03-31`,
              checkedBy: 'Field officer',
            },
          ]
        : [],
    figures: {
      co2eTotal: co2e,
      co2eLow: round(co2e * 0.6),
      co2eHigh: round(co2e * 1.5),
      socChangeTotal: round(-co2e / 3.67),
      runs: 1000,
      gwp: 'AR5',
      unit: 't CO2e',
    },
    risk: { level, label: LABELS[level - 1]! },
    factorSet: { id: 'ipcc-2006', version: 1 },
    ruleSet: { id: 'tarrow-screening', version: 1 },
    assessment: { number: 1 },
    meeting: { date: decidedOn, place: 'Bench hall' },
    votes: { approve: 3, approveWithConditions: 0, refuse: 1, defer: 0, abstain: 0, declaredConflicts: 0 },
    appealUntil: null,
    effectiveDate: decidedOn,
    decidedOn,
    recordedAt: `${decidedOn}T12:00:00.000Z`,
    supersedes: null,
    note: null,
  };
}

/** Appends entries until the register holds `target`; returns how many were written. */
export async function fillRegister(knex: Knex, target: number): Promise<number> {
  return knex.transaction(async (trx) => {
    await trx.raw('select pg_advisory_xact_lock(?)', [APPEND_LOCK]);
    const head = (await trx.raw('select seq::int as seq, hash from register_entry order by seq desc limit 1'))
      .rows[0] as { seq: number; hash: string } | undefined;
    let [seq, prevHash] = [head?.seq ?? 0, head?.hash ?? GENESIS_HASH];
    const start = seq;
    const rnd = random(seq + 7);
    const contents = new Map<number, RegisterContent>();
    const open: number[] = [];
    while (seq < target) {
      const cols: [number[], string[], string[], string[], (number | null)[]] = [[], [], [], [], []];
      for (let i = 0; i < BATCH && seq < target; i++) {
        seq++;
        let content = decision(rnd, seq);
        // One entry in forty corrects an earlier decision still in force (a new entry naming it).
        if (seq % 40 === 0 && open.length) {
          const old = open.splice(Math.floor(rnd() * open.length), 1)[0]!;
          content = {
            ...contents.get(old)!,
            kind: 'correction',
            outcome: 'refused',
            conditions: [],
            supersedes: old,
            note: 'The area was misstated; corrected on review.',
          };
        } else if (contents.size < 5000) {
          contents.set(seq, content);
          open.push(seq);
        }
        const hash = entryHash(seq, prevHash, content);
        cols[0].push(seq);
        cols[1].push(prevHash);
        cols[2].push(hash);
        cols[3].push(JSON.stringify(content));
        cols[4].push(content.supersedes);
        prevHash = hash;
      }
      await trx.raw(
        `insert into register_entry (seq, prev_hash, hash, content, supersedes_seq)
         select * from unnest(?::bigint[], ?::text[], ?::text[], ?::jsonb[], ?::bigint[])`,
        cols as unknown as Knex.RawBinding[],
      );
    }
    await trx.raw('analyze register_entry');
    return seq - start;
  });
}
