/**
 * The public register: append-only in the database, a hash chain anyone can recompute, verify
 * naming exactly the entry edited by hand, corrections as new entries, filters and paging, CSV and
 * GeoJSON exports that round-trip, and no personal data in any public answer.
 */
import { check as checkGeoJson } from '@placemarkio/check-geojson';
import type { FeatureCollection } from 'geojson';
import * as turf from '@turf/turf';
import canonicalize from 'canonicalize';
import { parse as parseCsv } from 'csv-parse/sync';
import { createHash } from 'node:crypto';
import http from 'node:http';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../scripts/demo/people';
import { editRegisterByHand, testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { decidedProposal } from '../support/board';
import { personalSecrets } from '../support/personal-data';

let s: { planner: Session; assessor: Session; board: Session; chair: Session; admin: Session };
const VOTE_COMMENT = 'Private remark of a member, never public 8841';
let decided: Awaited<ReturnType<typeof decidedProposal>>[] = [];
beforeAll(async () => {
  const [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  s = { planner, assessor, board, chair, admin };
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
  decided = [
    await decidedProposal(s, 'approved', VOTE_COMMENT),
    await decidedProposal(s, 'refused', VOTE_COMMENT),
    await decidedProposal(s, 'approved-with-conditions', VOTE_COMMENT),
  ];
}, 180_000);
afterAll(() => testDb.destroy());

/** The hash rule written out from the issue, with the `canonicalize` package and node:crypto directly (not the code under test). */
const hashOf = (seq: number, prevHash: string, content: unknown) =>
  createHash('sha256').update(canonicalize({ content, prevHash, seq })!, 'utf8').digest('hex');

describe('append-only in the database', () => {
  it('refuses UPDATE, DELETE and TRUNCATE by the owner (trigger) and UPDATE and DELETE by the writer role (privileges)', async () => {
    const seq = decided[0]!.seq;
    await expect(
      testDb.raw(`update register_entry set content = jsonb_set(content, '{outcome}', '"refused"') where seq = ?`, [
        seq,
      ]),
    ).rejects.toThrow(/append-only: UPDATE/);
    await expect(testDb.raw('delete from register_entry where seq = ?', [seq])).rejects.toThrow(/append-only: DELETE/);
    await expect(testDb.raw('truncate register_entry cascade')).rejects.toThrow(/append-only: TRUNCATE/);
    await expect(
      testDb.transaction(async (trx) => {
        await trx.raw('set local role swardkeep_register_writer');
        await trx.raw(`update register_entry set content = '{}' where seq = ${seq}`);
      }),
    ).rejects.toThrow(/permission denied for table register_entry/);
    await expect(
      testDb.transaction(async (trx) => {
        await trx.raw('set local role swardkeep_register_writer');
        await trx.raw(`delete from register_entry where seq = ${seq}`);
      }),
    ).rejects.toThrow(/permission denied for table register_entry/);
    // The writer may read and append (the app's path).
    await testDb.transaction(async (trx) => {
      await trx.raw('set local role swardkeep_register_writer');
      expect((await trx.raw('select count(*)::int as n from register_entry')).rows[0].n).toBeGreaterThan(0);
    });
    expect((await testDb('register_entry').where({ seq }).first()).content.outcome).toBe('approved');
  });
});

describe('the hash chain', () => {
  it('every entry hashes { content, prevHash, seq } in RFC 8785 form and names the previous hash; verify agrees', async () => {
    const rows = await testDb('register_entry').orderBy('seq');
    let prev = '0'.repeat(64);
    rows.forEach((r, i) => {
      expect(Number(r.seq)).toBe(i + 1);
      expect(r.prev_hash).toBe(prev);
      expect(hashOf(Number(r.seq), r.prev_hash, r.content)).toBe(r.hash);
      prev = r.hash;
    });
    const v = await api('GET', '/api/register/verify');
    expect(v.status).toBe(200);
    expect(v.body).toMatchObject({ ok: true, entries: rows.length, firstBrokenEntry: null, headHash: prev });
  });

  it('content edited by hand (trigger disabled by the owner) makes verify name exactly that entry', async () => {
    const target = decided[1]!.seq;
    const original = (await testDb.raw('select content::text as c from register_entry where seq = ?', [target])).rows[0]
      .c;
    await editRegisterByHand(
      `update register_entry set content = jsonb_set(content, '{outcome}', '"approved"') where seq = ?`,
      [target],
    );
    try {
      const v = (await api('GET', '/api/register/verify')).body;
      expect(v).toMatchObject({ ok: false, firstBrokenEntry: target });
      expect(v.problem).toMatch(new RegExp(`content of entry ${target}`));
    } finally {
      await editRegisterByHand('update register_entry set content = ?::jsonb where seq = ?', [original, target]);
    }
    expect((await api('GET', '/api/register/verify')).body).toMatchObject({ ok: true, firstBrokenEntry: null });
  });

  it('concurrent appends queue behind the lock: no fork, no gap', async () => {
    const before = (await api('GET', '/api/register/verify')).body.entries;
    const extra = [await decidedProposal(s, 'approved'), await decidedProposal(s, 'approved')];
    const res = await Promise.all(
      [...decided, ...extra].map((d, i) =>
        api('POST', `/api/register/${d.seq}/corrections`, {
          session: i % 2 ? s.admin : s.chair,
          body: { kind: 'correction', note: `Parcel reference spelt out in full (${i}).` },
        }),
      ),
    );
    expect(res.map((r) => r.status)).toEqual(res.map(() => 201));
    const seqs = res.map((r) => r.body.seq).sort((a, b) => a - b);
    expect(seqs).toEqual(seqs.map((_, i) => before + 2 + 1 + i));
    expect((await api('GET', '/api/register/verify')).body).toMatchObject({
      ok: true,
      entries: before + 2 + res.length,
    });
    decided = [...decided, ...extra].map((d, i) => ({ ...d, seq: res[i]!.body.seq }));
  });
});

describe('corrections and appeal outcomes', () => {
  it('a new entry names the one it supersedes; the old one stays, marked; it cannot be superseded twice', async () => {
    const d = decided[1]!; // refused, corrected once above
    const appeal = await api('POST', `/api/register/${d.seq}/corrections`, {
      session: s.chair,
      body: {
        kind: 'appeal-outcome',
        note: 'The appeal was allowed: the board approves with a condition.',
        outcome: 'approved-with-conditions',
        conditions: [{ text: 'Sow a grass margin of 6 m.', dueDate: '2028-04-30', checkedBy: 'Field officer' }],
      },
    });
    expect(appeal.status).toBe(201);
    const entry = (await api('GET', `/api/register/${appeal.body.seq}`)).body;
    expect(entry.content).toMatchObject({
      kind: 'appeal-outcome',
      supersedes: d.seq,
      outcome: 'approved-with-conditions',
      proposal: { reference: d.proposal.reference },
    });
    expect(entry.supersedesSeq).toBe(d.seq);
    expect((await api('GET', `/api/register/${d.seq}`)).body.supersededBy).toBe(appeal.body.seq);
    const twice = await api('POST', `/api/register/${d.seq}/corrections`, {
      session: s.chair,
      body: { kind: 'correction', note: 'Trying to correct an old entry again.' },
    });
    expect(twice.status).toBe(409);
    expect(
      (
        await api('POST', `/api/register/${appeal.body.seq}/corrections`, {
          session: s.board,
          body: { kind: 'correction', note: 'A member may not correct the register.' },
        })
      ).status,
    ).toBe(403);
    const current = (await api('GET', `/api/register?current=true&q=${d.proposal.reference}`)).body;
    expect(current.items.map((i: { seq: number }) => i.seq)).toEqual([appeal.body.seq]);
    decided[1] = { ...d, seq: appeal.body.seq };
  });
});

describe('listing', () => {
  it('filters, sorts and pages on the server, with the head hash', async () => {
    const all = await testDb('register_entry').orderBy('seq');
    const head = all[all.length - 1]!;
    const page = (await api('GET', '/api/register?pageSize=2&page=1&sort=seq&dir=asc')).body;
    expect(page).toMatchObject({
      total: all.length,
      page: 1,
      pageSize: 2,
      headSeq: Number(head.seq),
      headHash: head.hash,
    });
    expect(page.items.map((i: { seq: number }) => i.seq)).toEqual([1, 2]);
    const refused = (await api('GET', '/api/register?outcome=refused&pageSize=200')).body;
    expect(refused.total).toBe(all.filter((r) => r.content.outcome === 'refused').length);
    expect(refused.items.every((i: { outcome: string }) => i.outcome === 'refused')).toBe(true);
    // The demo history (2021-2026) and the entries made here span several years.
    const yearOf = (r: { content: { decidedOn: string } }) => Number(r.content.decidedOn.slice(0, 4));
    for (const year of new Set(all.map(yearOf)))
      expect((await api('GET', `/api/register?year=${year}`)).body.total).toBe(
        all.filter((r) => yearOf(r) === year).length,
      );
    expect((await api('GET', `/api/register?year=${Math.min(...all.map(yearOf)) - 1}`)).body.total).toBe(0);
    const level = all[0]!.content.risk.level;
    expect((await api('GET', `/api/register?risk=${level}`)).body.total).toBe(
      all.filter((r) => r.content.risk.level === level).length,
    );
    const area = all[0]!.content.areaHa;
    expect((await api('GET', `/api/register?areaMin=${area - 0.0001}&areaMax=${area + 0.0001}`)).body.total).toBe(
      all.filter((r) => Math.abs(r.content.areaHa - area) <= 0.0001).length,
    );
    expect((await api('GET', `/api/register?areaMin=${area + 1000}`)).body.total).toBe(0);
    const region = all[0]!.content.region;
    if (region)
      expect((await api('GET', `/api/register?region=${encodeURIComponent(region)}`)).body.total).toBe(
        all.filter((r) => r.content.region === region).length,
      );
    const byCo2e = (await api('GET', '/api/register?sort=co2e&dir=desc&pageSize=200')).body.items.map(
      (i: { co2eTotal: number }) => i.co2eTotal,
    );
    expect(byCo2e).toEqual([...byCo2e].sort((a, b) => b - a));
    const bad = await api('GET', '/api/register?risk=9');
    expect(bad.status).toBe(422);
    expect((await api('GET', '/api/register/999999')).status).toBe(404);
  });
});

describe('answers kept by head', () => {
  it('an answer is reused only while the head is the same: a new entry shows at once, the same query asked again included', async () => {
    const path = '/api/register?outcome=approved&pageSize=200&sort=seq&dir=desc';
    const first = (await api('GET', path)).body;
    expect((await api('GET', path)).body).toEqual(first);
    const added = await decidedProposal(s, 'approved');
    const again = (await api('GET', path)).body;
    expect(again.headSeq).toBe(first.headSeq + 1);
    expect(again.total).toBe(first.total + 1);
    expect(again.items[0].seq).toBe(added.seq);
    const head = await testDb('register_entry').orderBy('seq', 'desc').first();
    expect(again.headHash).toBe(head.hash);
  }, 120_000);

  it('kept answers: Brotli and gzip copies hold the same JSON, a matching If-None-Match gets 304 until the head moves', async () => {
    const path = '/api/register?pageSize=200&sort=seq&dir=desc';
    const plain = await raw(path, {});
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(Number(plain.headers['content-length'])).toBe(plain.bytes.length);
    expect(plain.headers['cache-control']).toBe('public, no-cache');
    const etag = plain.headers.etag!;
    expect(etag).toMatch(/^"k[\w-]+"$/);
    const br = await raw(path, { 'accept-encoding': 'gzip;q=0.5, br' });
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.etag).toBe(etag);
    expect(zlib.brotliDecompressSync(br.bytes).equals(plain.bytes)).toBe(true);
    // Asked again, the kept copy: the same bytes.
    expect((await raw(path, { 'accept-encoding': 'br' })).bytes.equals(br.bytes)).toBe(true);
    const gz = await raw(path, { 'accept-encoding': 'gzip, br;q=0' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.bytes).equals(plain.bytes)).toBe(true);
    const none = await raw(path, { 'accept-encoding': 'identity' });
    expect(none.headers['content-encoding']).toBeUndefined();
    expect(none.bytes.equals(plain.bytes)).toBe(true);
    const same = await raw(path, { 'if-none-match': etag });
    expect(same.status).toBe(304);
    expect(same.bytes.length).toBe(0);
    await decidedProposal(s, 'refused');
    const moved = await raw(path, { 'if-none-match': etag });
    expect(moved.status).toBe(200);
    expect(moved.headers.etag).not.toBe(etag);
    expect(JSON.parse(moved.bytes.toString()).headSeq).toBe(JSON.parse(plain.bytes.toString()).headSeq + 1);
  }, 120_000);
});

/** A GET with exactly these headers (fetch would ask for and undo compression itself). */
function raw(path: string, headers: Record<string, string>) {
  return new Promise<{ status: number; headers: http.IncomingHttpHeaders; bytes: Buffer }>((resolve, reject) => {
    const req = http.request(`${BASE_URL}${path}`, { headers }, (res) => {
      const parts: Buffer[] = [];
      res.on('data', (d: Buffer) => parts.push(d));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, bytes: Buffer.concat(parts) }));
    });
    req.on('error', reject);
    req.end();
  });
}

describe('exports', () => {
  it('CSV: a spreadsheet-compatible parser reads the same rows as the database, filters included', async () => {
    const res = await fetch(`${BASE_URL}/api/register.csv`);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    const records: Record<string, string>[] = parseCsv(await res.text(), { columns: true, skip_empty_lines: true });
    const rows = await testDb('register_entry').orderBy('seq');
    expect(records).toHaveLength(rows.length);
    records.forEach((r, i) => {
      const db = rows[i]!;
      expect(Number(r.seq)).toBe(Number(db.seq));
      expect(r.hash).toBe(db.hash);
      expect(r.reference).toBe(db.content.proposal.reference);
      expect(r.outcome).toBe(db.content.outcome);
      expect(Number(r.area_ha)).toBe(db.content.areaHa);
      expect(Number(r.co2e_t)).toBe(db.content.figures.co2eTotal);
      expect(r.reasons).toBe(db.content.reasons);
    });
    const refused = parseCsv(await (await fetch(`${BASE_URL}/api/register.csv?outcome=refused`)).text(), {
      columns: true,
    });
    expect(refused).toHaveLength(rows.filter((r) => r.content.outcome === 'refused').length);
  });

  it('GeoJSON: valid RFC 7946, one feature per entry, areas as in the database', async () => {
    const res = await fetch(`${BASE_URL}/api/register.geojson`);
    expect(res.headers.get('content-type')).toBe('application/geo+json');
    const text = await res.text();
    const fc = checkGeoJson(text) as FeatureCollection; // throws with the RFC 7946 problems when invalid
    const rows = await testDb('register_entry').orderBy('seq');
    expect(fc.features).toHaveLength(rows.length);
    fc.features.forEach((f, i) => {
      const db = rows[i]!;
      expect(f.properties!.seq).toBe(Number(db.seq));
      expect(f.properties!.areaHa).toBe(db.content.areaHa);
      // Spherical area (turf) against the stored ellipsoidal area: within 0.5 % at this latitude (common practice).
      expect(turf.area(f as never) / 10_000).toBeCloseTo(db.content.areaHa, 1);
      expect(Math.abs(turf.area(f as never) / 10_000 / db.content.areaHa - 1)).toBeLessThan(0.005);
    });
    const approved = JSON.parse(await (await fetch(`${BASE_URL}/api/register.geojson?outcome=approved`)).text());
    expect(approved.features).toHaveLength(rows.filter((r) => r.content.outcome === 'approved').length);
  });
});

describe('no personal data in public answers', () => {
  it('list, entries, verify, exports and the register pages hold no applicant, owner, holding reference, member name or vote comment', async () => {
    const secrets = await personalSecrets([VOTE_COMMENT]);
    expect(secrets).toContain('HLD-TEST-77');
    const seqs = (await testDb('register_entry').select('seq')).map((r) => Number(r.seq));
    const paths = [
      '/api/register?pageSize=200',
      '/api/register/verify',
      '/api/register.csv',
      '/api/register.geojson',
      ...seqs.map((q) => `/api/register/${q}`),
      '/register',
      ...seqs.map((q) => `/register/${q}`),
    ];
    for (const p of paths) {
      const res = await fetch(`${BASE_URL}${p}`);
      expect(res.status, p).toBe(200);
      const text = await res.text();
      for (const secret of secrets) expect(text.includes(secret), `${p} contains "${secret}"`).toBe(false);
    }
  });
});

describe('filter by region name', () => {
  it('takes the region’s key, its name in any case, or the unique start of its name', async () => {
    const names = (await api('GET', '/api/regions', { session: s.admin })).body.items as {
      key: string;
      label: string;
    }[];
    const all = await testDb('register_entry');
    for (const r of names) {
      const n = all.filter((e) => e.content.region === r.key).length;
      for (const v of [r.key, r.label, r.label.toUpperCase(), r.label.split(' ')[0]!.toLowerCase()]) {
        expect((await api('GET', `/api/register?region=${encodeURIComponent(v)}&pageSize=200`)).body.total, v).toBe(n);
      }
      const csv = parseCsv(
        await (await fetch(`${BASE_URL}/api/register.csv?region=${encodeURIComponent(r.label)}`)).text(),
        { columns: true },
      );
      expect(csv).toHaveLength(n);
    }
    expect(names.some((r) => all.some((e) => e.content.region === r.key))).toBe(true);
    expect((await api('GET', '/api/register?region=Nowhere%20district')).body.total).toBe(0);
  });
});

describe('setting register.votes-public', () => {
  it('off (default): no member names or choices; on: each member’s name and choice on the entry, never the comment', async () => {
    const seq = decided[0]!.seq; // a correction of an approval: the votes are the original decision's
    const names = DEMO_PEOPLE.filter((p) => p.roles.includes('board')).map((p) => p.name);
    const off = await api('GET', `/api/register/${seq}`);
    expect(off.body.memberVotes).toBeNull();
    const offPage = await (await fetch(`${BASE_URL}/register/${seq}`)).text();
    for (const n of names) expect(offPage).not.toContain(n);
    await testDb('app_setting')
      .insert({ key: 'register.votes-public', value: JSON.stringify(true) })
      .onConflict('key')
      .merge();
    try {
      const on = await api('GET', `/api/register/${seq}`);
      expect(on.body.memberVotes).toEqual(names.sort().map((name) => ({ name, choice: 'approve' })));
      const page = await (await fetch(`${BASE_URL}/register/${seq}`)).text();
      expect(page).toContain('How the members voted');
      for (const n of names) expect(page).toContain(`${n}: approve`);
      expect(page).not.toContain(VOTE_COMMENT);
      expect(JSON.stringify(on.body)).not.toContain(VOTE_COMMENT);
    } finally {
      await testDb('app_setting').where({ key: 'register.votes-public' }).delete();
    }
    expect((await api('GET', `/api/register/${seq}`)).body.memberVotes).toBeNull();
  });
});
