/**
 * Proposals through the API: filing, the state machine for every role, stale versions, parts
 * of parcels, attachments (checked by content), and mail through the outbox.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { deflateRawSync } from 'node:zlib';
import { testDb, waitForMail } from '../support/db';
import { SMTP_PORT } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { APPLICANT, CROPLAND, drawParcel, fileProposal, freeBox, rect } from '../support/proposals';

let planner: Session, assessor: Session, board: Session, chair: Session, admin: Session;
let parcelId: number;
beforeAll(async () => {
  [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  parcelId = await drawParcel(planner);
});
afterAll(() => testDb.destroy());

const STATES = [
  'draft',
  'submitted',
  'returned',
  'in-assessment',
  'assessed',
  'on-agenda',
  'decided',
  'withdrawn',
] as const;
type State = (typeof STATES)[number];

/**
 * The allowed moves, written out from the proposals issue (not read from the code under test):
 * planners submit drafts and returned proposals and may withdraw until decided; assessors start,
 * return (asking for more information) and reopen; "assessed" comes only from signing off.
 */
const ALLOWED: Record<string, 'planner' | 'assessor'> = {
  'draft>submitted': 'planner',
  'returned>submitted': 'planner',
  'submitted>in-assessment': 'assessor',
  'submitted>returned': 'assessor',
  'in-assessment>returned': 'assessor',
  'assessed>in-assessment': 'assessor',
  'draft>withdrawn': 'planner',
  'submitted>withdrawn': 'planner',
  'returned>withdrawn': 'planner',
  'in-assessment>withdrawn': 'planner',
  'assessed>withdrawn': 'planner',
  'on-agenda>withdrawn': 'planner',
};
/** Moves the state machine knows but only another action makes (signing off; the board's agenda and decision): asked for directly, 409 for its role. */
const VIA_ACTION: Record<string, 'assessor' | 'chair'> = {
  'in-assessment>assessed': 'assessor',
  'assessed>on-agenda': 'chair',
  'on-agenda>decided': 'chair',
};

describe('filing a proposal', () => {
  it('a planner files a draft; the applicant stays private', async () => {
    const res = await api('POST', '/api/proposals', {
      session: planner,
      body: {
        title: 'Plough the north field',
        description: 'Spring barley after grass.',
        startYear: 2027,
        parcels: [{ parcelId }],
        proposed: CROPLAND,
        applicant: APPLICANT,
      },
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ state: 'draft', version: 1, reference: expect.stringMatching(/^P-\d{4}-\d{4}$/) });
    const asPlanner = (await api('GET', `/api/proposals/${res.body.id}`, { session: planner })).body;
    expect(asPlanner.applicant).toEqual(APPLICANT);
    expect(asPlanner.history).toEqual([expect.objectContaining({ from: null, to: 'draft' })]);
    const asBoard = (await api('GET', `/api/proposals/${res.body.id}`, { session: board })).body;
    expect(asBoard.applicant).toBeNull();
    expect(JSON.stringify(asBoard)).not.toContain(APPLICANT.contact);
    const list = await api(
      'GET',
      `/api/proposals?state=draft&q=${encodeURIComponent('north field')}&sort=title&dir=asc&pageSize=5`,
      { session: board },
    );
    expect(list.status).toBe(200);
    expect(list.body.items.map((i: { id: number }) => i.id)).toContain(res.body.id);
    expect(list.body.pageSize).toBe(5);
  });

  it('bad input is refused naming the field, and nothing is stored', async () => {
    const before = Number((await testDb('proposal').count('* as n').first())?.n);
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ parcels: [] }, /at least one parcel/],
      [{ parcels: [{ parcelId: 987654321 }] }, /No parcel with id 987654321/],
      [{ parcels: [{ parcelId }, { parcelId }] }, /named twice/],
      [{ startYear: 1890 }, /2000 or later/],
      [{ proposed: { landUse: 'cropland', system: 'orchard', tillage: 'full', input: 'medium' } }, /proposed/],
      [{ applicant: { ...APPLICANT, interest: 'neighbour' } }, /owner, tenant or agent/],
      [{ parcels: [{ parcelId, part: rect([0, 0, 50, 50]) }] }, /outside the parcel/],
    ];
    for (const [change, message] of cases) {
      const res = await api('POST', '/api/proposals', {
        session: planner,
        body: {
          title: 'Bad',
          description: 'A proposal with a mistake in it.',
          startYear: 2027,
          parcels: [{ parcelId }],
          proposed: CROPLAND,
          applicant: APPLICANT,
          ...change,
        },
      });
      expect(res.status, JSON.stringify(change)).toBe(422);
      expect(JSON.stringify(res.body.error), JSON.stringify(change)).toMatch(message);
    }
    expect(Number((await testDb('proposal').count('* as n').first())?.n)).toBe(before);
  });

  it('a drawn part inside the parcel is stored with its own ellipsoidal area', async () => {
    const box = await freeBox(150);
    const whole = await drawParcel(planner, box);
    // 60 m x 100 m inside the 150 m square: 0.6 ha of grid area (UTM scale factor ~0.9997 at this longitude: within 0.2 %).
    const part = rect([box[0] + 10, box[1] + 10, box[0] + 70, box[1] + 110]);
    const p = await fileProposal(planner, [{ parcelId: whole, part }]);
    const detail = (await api('GET', `/api/proposals/${p.id}`, { session: planner })).body;
    expect(detail.parcels[0].areaHa).toBeCloseTo(0.6, 2);
    expect(detail.parcels[0].parcelAreaHa).toBeCloseTo(2.25, 2);
    expect(detail.parcels[0].part.type).toBe('MultiPolygon');
  });
});

describe('the state machine, for every role', () => {
  const sessions = () => ({ planner, assessor, board, chair, admin });
  async function setState(id: number, state: State): Promise<number> {
    const [row] = await testDb('proposal')
      .where({ id })
      .update({ state, version: testDb.raw('version + 1') })
      .returning('version');
    return row.version;
  }

  it('allows exactly the listed moves to the listed role; 409 for moves the machine does not allow, 403 for the wrong role', async () => {
    const { id } = await fileProposal(planner, [{ parcelId }]);
    const seen: string[] = [];
    for (const from of STATES) {
      for (const to of STATES) {
        for (const [role, session] of Object.entries(sessions())) {
          const version = await setState(id, from);
          const res = await api('POST', `/api/proposals/${id}/transitions`, {
            session,
            body: { to, version, reason: 'Checked in the state-machine test.' },
          });
          const key = `${from}>${to}`;
          const staff = role === 'planner' || role === 'assessor';
          let expected: number;
          if (!staff)
            expected = 403; // board, chair and admin never move proposals here
          else if (ALLOWED[key]) expected = ALLOWED[key] === role ? 200 : 403;
          else if (VIA_ACTION[key]) expected = VIA_ACTION[key] === role ? 409 : 403;
          else expected = 409;
          expect(res.status, `${role}: ${key} ${JSON.stringify(res.body)}`).toBe(expected);
          const row = await testDb('proposal').where({ id }).first();
          expect(row.state, `${role}: ${key}`).toBe(expected === 200 ? to : from);
          if (expected === 200) seen.push(key);
        }
      }
    }
    expect(seen.sort()).toEqual(Object.keys(ALLOWED).sort());
  }, 120_000);

  it('a stale version gets 409 and changes nothing; a return or a withdrawal needs a reason', async () => {
    const p = await fileProposal(planner, [{ parcelId }]);
    const ok = await api('PATCH', `/api/proposals/${p.id}`, {
      session: planner,
      body: { title: 'Plough the north field, amended', version: p.version },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.version).toBe(p.version + 1);
    const stale = await api('PATCH', `/api/proposals/${p.id}`, {
      session: planner,
      body: { title: 'Overwrite', version: p.version },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/Someone else changed/);
    const staleMove = await api('POST', `/api/proposals/${p.id}/transitions`, {
      session: planner,
      body: { to: 'submitted', version: p.version },
    });
    expect(staleMove.status).toBe(409);
    const row = await testDb('proposal').where({ id: p.id }).first();
    expect(row).toMatchObject({ title: 'Plough the north field, amended', state: 'draft', version: p.version + 1 });
    const noReason = await api('POST', `/api/proposals/${p.id}/transitions`, {
      session: planner,
      body: { to: 'withdrawn', version: row.version },
    });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.issues[0].path).toEqual(['reason']);
  });

  it('submission starts the statutory clock (35 days by default) and a submitted proposal can no longer be edited', async () => {
    const p = await fileProposal(planner, [{ parcelId }]);
    const res = await api('POST', `/api/proposals/${p.id}/transitions`, {
      session: planner,
      body: { to: 'submitted', version: p.version },
    });
    expect(res.status).toBe(200);
    const detail = (await api('GET', `/api/proposals/${p.id}`, { session: assessor })).body;
    // England EIA (Agriculture) (No.2) Regulations 2006 reg. 8(5): screening decision within 35 days.
    const due = new Date(Date.now() + 35 * 86_400_000).toISOString().slice(0, 10);
    expect(detail.decisionDue).toBe(due);
    expect(detail.daysLeft).toBe(35);
    const edit = await api('PATCH', `/api/proposals/${p.id}`, {
      session: planner,
      body: { title: 'Too late', version: detail.version },
    });
    expect(edit.status).toBe(409);
    const audit = await testDb('audit_event')
      .where({ action: 'proposal.submitted', entity_id: String(p.id) })
      .first();
    expect(audit).toBeTruthy();
  });
});

describe('mail through the outbox', () => {
  it('with the mail server stopped, a submission still succeeds and its mail goes out once the server is back', async () => {
    const pid = Number(readFileSync(`.data/test-mail-${SMTP_PORT}.pid`, 'utf8'));
    const p = await fileProposal(planner, [{ parcelId }], { title: `Outbox check ${Date.now()}` });
    // Let the outbox drain first (the seed's and earlier tests' mail), so that ours is the one the worker tries.
    for (let i = 0; i < 120; i++) {
      const due = await testDb('mail_outbox')
        .whereNull('sent_at')
        .where('next_attempt_at', '<=', testDb.fn.now())
        .count('* as n')
        .first();
      if (Number(due?.n) === 0) break;
      await new Promise((r) => setTimeout(r, 500));
    }
    process.kill(pid, 'SIGSTOP');
    let row: { id: number; attempts: number; sent_at: Date | null } | undefined;
    try {
      const res = await api('POST', `/api/proposals/${p.id}/transitions`, {
        session: planner,
        body: { to: 'submitted', version: p.version },
      });
      expect(res.status).toBe(200);
      const deadline = Date.now() + 60_000;
      do {
        await new Promise((r) => setTimeout(r, 500));
        row = await testDb('mail_outbox')
          .where('subject', 'like', `%${p.reference}%`)
          .where({ recipient: DEMO.assessor })
          .first();
      } while ((!row || row.attempts === 0) && Date.now() < deadline);
      expect(row?.attempts).toBeGreaterThan(0);
      expect(row?.sent_at).toBeNull();
    } finally {
      process.kill(pid, 'SIGCONT');
    }
    await testDb('mail_outbox').where({ id: row!.id }).update({ next_attempt_at: testDb.fn.now() });
    const mail = await waitForMail(DEMO.assessor, new RegExp(`${p.reference} submitted`), 0, 30_000);
    expect(mail.body_text).toContain('for assessment');
  }, 180_000);
});

describe('attachments', () => {
  const pdf = new TextEncoder().encode(
    '%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n',
  );
  // PNG (ISO/IEC 15948): signature, then an IHDR chunk of 1 x 1 pixels.
  const png = Uint8Array.from([
    0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2,
    0, 0, 0, 0x90, 0x77, 0x53, 0xde, 0, 0, 0, 0,
  ]);
  async function attach(id: number, name: string, bytes: Uint8Array, session = planner) {
    const form = new FormData();
    form.set('file', new Blob([bytes as BlobPart]), name);
    const res = await fetch(`http://127.0.0.1:${process.env.TEST_APP_PORT ?? 4391}/api/proposals/${id}/attachments`, {
      method: 'POST',
      headers: { cookie: session.cookie, origin: `http://127.0.0.1:${process.env.TEST_APP_PORT ?? 4391}` },
      body: form,
    });
    return { status: res.status, body: await res.json() };
  }

  it('keeps a PDF and a PNG with their SHA-256 and serves them back as downloads', async () => {
    const p = await fileProposal(planner, [{ parcelId }]);
    const a = await attach(p.id, 'site-plan.pdf', pdf);
    expect(a.status).toBe(201);
    expect(a.body).toMatchObject({ mediaType: 'application/pdf', sizeBytes: pdf.length });
    expect((await attach(p.id, 'photo.png', png)).body.mediaType).toBe('image/png');
    const res = await fetch(
      `http://127.0.0.1:${process.env.TEST_APP_PORT ?? 4391}/api/proposals/${p.id}/attachments/${a.body.id}`,
      { headers: { cookie: board.cookie } },
    );
    expect(res.headers.get('content-disposition')).toMatch(/^attachment/);
    expect(new Uint8Array(await res.arrayBuffer())).toEqual(pdf);
  });

  it('refuses hostile files with a clear message and stores nothing', async () => {
    const p = await fileProposal(planner, [{ parcelId }]);
    const zipBomb = Uint8Array.from([
      0x50,
      0x4b,
      0x03,
      0x04,
      ...deflateRawSync(Buffer.alloc(5_000_000)).subarray(0, 200),
    ]);
    const hugePng = png.slice();
    new DataView(hugePng.buffer).setUint32(16, 100_000);
    new DataView(hugePng.buffer).setUint32(20, 100_000);
    const cases: [string, Uint8Array, number, RegExp][] = [
      ['invoice.pdf', new Uint8Array([0x4d, 0x5a, 0x90, 0, 3, 0, 0, 0]), 415, /program/],
      ['letter.pdf', new TextEncoder().encode('<!doctype html><script>alert(1)</script>'), 415, /web page/],
      ['field.png', zipBomb, 415, /zip archive/],
      ['field2.png', hugePng, 415, /100000 x 100000 pixels/],
      ['cut.pdf', pdf.subarray(0, 30), 415, /incomplete/],
    ];
    for (const [name, bytes, status, message] of cases) {
      const res = await attach(p.id, name, bytes);
      expect(res.status, name).toBe(status);
      expect(res.body.error.message, name).toMatch(message);
    }
    await testDb('app_setting')
      .insert({ key: 'proposal.attachment-max-bytes', value: JSON.stringify(1000) })
      .onConflict('key')
      .merge();
    try {
      const big = new Uint8Array(5000);
      big.set(pdf);
      const res = await attach(p.id, 'big.pdf', big);
      expect(res.status).toBe(413);
    } finally {
      await testDb('app_setting').where({ key: 'proposal.attachment-max-bytes' }).delete();
    }
    expect(await testDb('proposal_attachment').where({ proposal_id: p.id })).toEqual([]);
  });
});
