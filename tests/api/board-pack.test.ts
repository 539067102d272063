/**
 * The board pack (JSON and PDF), the agenda order and the public decision notice: the pack
 * carries the signed assessment's figures, the risk reasons and the impact of approving, but
 * no applicant or owner; the agenda order is guarded by the meeting version; the notice holds
 * only public register content with its hashes. PDFs are read back with pdf-parse.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../scripts/demo/people';
import { CONDITION, assessedProposal, createMeeting, decide, vote } from '../support/board';
import { testDb } from '../support/db';
import { BASE_URL } from '../support/env';
import { api, DEMO, signIn, type Session } from '../support/http';
import { pdfText as textOf } from '../support/pdf';
import { APPLICANT } from '../support/proposals';

let planner: Session, assessor: Session, board: Session, chair: Session, admin: Session;
let a: Awaited<ReturnType<typeof assessedProposal>>, b: Awaited<ReturnType<typeof assessedProposal>>;
let meeting: Awaited<ReturnType<typeof createMeeting>>;
const OWNER = 'HLD-PACK-4411';
const COMMENT = 'Members only remark 5120';

beforeAll(async () => {
  [planner, assessor, board, chair, admin] = await Promise.all(
    [DEMO.planner, DEMO.assessor, DEMO.board, DEMO.chair, DEMO.admin].map((e) => signIn(e)),
  );
  await testDb('app_setting').where({ key: 'board.quorum' }).delete();
  a = await assessedProposal(planner, assessor, OWNER);
  b = await assessedProposal(planner, assessor, OWNER);
  meeting = await createMeeting(chair, [a.id, b.id]);
}, 180_000);
afterAll(() => testDb.destroy());

const itemOf = (proposalId: number) => meeting.items.find((i) => i.proposalId === proposalId)!;
const pdfText = async (res: Response) => textOf(await res.arrayBuffer());
const squash = (s: string) => s.replace(/\s+/g, '');

/** Every applicant, owner, holding reference and vote comment the database knows, and (staffToo) every member's name and e-mail. */
async function secrets(staffToo = true): Promise<string[]> {
  const applicants = await testDb('proposal').distinct('applicant_name', 'applicant_contact');
  const owners = (await testDb('parcel').whereNotNull('owner_ref').distinct('owner_ref')).map(
    (r) => r.owner_ref as string,
  );
  expect(owners).toContain(OWNER);
  return [
    APPLICANT.name,
    APPLICANT.contact,
    COMMENT,
    ...applicants.flatMap((x) => [x.applicant_name, x.applicant_contact]),
    ...owners,
    ...(staffToo ? DEMO_PEOPLE.flatMap((p) => [p.name, p.email]) : []),
  ].filter(Boolean);
}

describe('the pack as JSON', () => {
  it('carries the signed assessment, the clock and the impact preview for board, chair and admin; no owner or applicant', async () => {
    const item = itemOf(a.id);
    const path = `/api/meetings/${meeting.id}/items/${item.id}/pack`;
    for (const s of [board, chair, admin]) expect((await api('GET', path, { session: s })).status).toBe(200);
    expect((await api('GET', path, { session: planner })).status).toBe(403);
    expect((await api('GET', path)).status).toBe(401);

    const res = await api('GET', path, { session: board });
    const p = res.body;
    const assessment = (await api('GET', `/api/assessments/${p.assessment.id}`, { session: board })).body;
    expect(assessment.status).toBe('signed');
    expect(p.proposal.reference).toBe(a.reference);
    expect(p.assessment.totals).toEqual(assessment.totals);
    expect(p.risk.level).toBe(assessment.grade.level);
    expect(p.risk.reasons.map((r: { text: string }) => r.text)).toEqual(
      assessment.grade.reasons.map((r: { text: string }) => r.text),
    );
    expect(p.alternatives).toEqual(assessment.alternatives);
    expect(p.assessment.findings).toBe('Signed off for the board tests.');
    expect(p.parcels).toHaveLength(1);
    expect(p.parcels[0].geometry.type).toBe('MultiPolygon');
    const proposal = await testDb('proposal').where({ id: a.id }).first();
    expect(p.clock.decisionDue).toBe(proposal.decision_due.toISOString?.().slice(0, 10) ?? proposal.decision_due);
    expect(['running', 'near', 'overdue']).toContain(p.clock.state);
    // Budget after approval = committed + this proposal (common practice: a budget is the running sum of commitments).
    const budget = p.impact.budget;
    expect(budget.proposalT).toBeCloseTo(assessment.totals.co2eTotal, 9);
    expect(budget.afterT).toBeCloseTo(budget.committedT + budget.proposalT, 9);
    if (budget.budgetT !== null) expect(budget.shareAfter).toBeCloseTo(budget.afterT / budget.budgetT, 12);
    // Ratio = permanent grassland / agricultural area (Reg. (EU) 2021/2115, Annex III, GAEC 1); after removes what is converted.
    for (const r of p.impact.regions) {
      expect(r.ratioNow).toBeCloseTo(r.permanentGrasslandHa / r.agriculturalHa, 12);
      expect(r.ratioAfter).toBeCloseTo((r.permanentGrasslandHa - r.convertedHa) / r.agriculturalHa, 12);
    }
    // The pack is board-internal: staff names (the signing assessor) may appear, applicants and owners never.
    for (const s of await secrets(false)) expect(JSON.stringify(p).includes(s), `pack contains "${s}"`).toBe(false);
  });

  it('the board pages are for board, chair and admin only; only chair and admin get the meeting form', async () => {
    const page = (s?: Session) =>
      fetch(`${BASE_URL}/board/meetings/${meeting.id}`, { headers: s ? { cookie: s.cookie } : {}, redirect: 'manual' });
    expect((await page()).status).toBe(302);
    expect((await page(planner)).status).toBe(403);
    expect((await page(assessor)).status).toBe(403);
    const forBoard = await page(board);
    expect(forBoard.status).toBe(200);
    const html = await forBoard.text();
    expect(html).toContain(a.reference);
    for (const s of [APPLICANT.name, APPLICANT.contact, OWNER])
      expect(html.includes(s), `meeting page contains "${s}"`).toBe(false);
    const list = async (s: Session) => (await fetch(`${BASE_URL}/board`, { headers: { cookie: s.cookie } })).text();
    expect(await list(board)).not.toContain('Create the meeting');
    expect(await list(chair)).toContain('Create the meeting');
    expect(await list(admin)).toContain('Create the meeting');
  });

  it('an item of another meeting is 404', async () => {
    const other = await createMeeting(admin, []);
    expect(
      (await api('GET', `/api/meetings/${other.id}/items/${itemOf(a.id).id}/pack`, { session: board })).status,
    ).toBe(404);
  });
});

describe('the agenda order', () => {
  it('the chair reorders with the version read; a stale version gets 409; a wrong list 422; members 403', async () => {
    const m = (await api('GET', `/api/meetings/${meeting.id}`, { session: chair })).body;
    const ids = m.items.map((i: { id: number }) => i.id);
    const reversed = [...ids].reverse();
    expect(
      (
        await api('PUT', `/api/meetings/${meeting.id}/order`, {
          session: board,
          body: { itemIds: reversed, version: m.version },
        })
      ).status,
    ).toBe(403);
    const ok = await api('PUT', `/api/meetings/${meeting.id}/order`, {
      session: chair,
      body: { itemIds: reversed, version: m.version },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.version).toBe(m.version + 1);
    const after = (await api('GET', `/api/meetings/${meeting.id}`, { session: chair })).body;
    expect(after.items.map((i: { id: number }) => i.id)).toEqual(reversed);
    expect(after.items.map((i: { position: number }) => i.position)).toEqual(ids.map((_: number, n: number) => n + 1));

    const stale = await api('PUT', `/api/meetings/${meeting.id}/order`, {
      session: admin,
      body: { itemIds: ids, version: m.version },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toMatch(/changed by someone else .*nothing was saved/);
    const missing = await api('PUT', `/api/meetings/${meeting.id}/order`, {
      session: chair,
      body: { itemIds: reversed.slice(1), version: after.version },
    });
    expect(missing.status).toBe(422);
    expect(
      (await api('GET', `/api/meetings/${meeting.id}`, { session: chair })).body.items.map((i: { id: number }) => i.id),
    ).toEqual(reversed);
  });
});

describe('the board pack PDF', () => {
  it('one section per item with map, figures, range, risk reasons, impact and the cautions; members only; no personal data', async () => {
    const url = `${BASE_URL}/api/meetings/${meeting.id}/pack.pdf`;
    expect((await fetch(url)).status).toBe(401);
    expect((await api('GET', `/api/meetings/${meeting.id}/pack.pdf`, { session: planner })).status).toBe(403);
    const res = await fetch(url, { headers: { cookie: board.cookie } });
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    const text = await pdfText(res);
    for (const ref of [a.reference, b.reference]) expect(text).toContain(ref);
    expect(text.match(/Map of the parcels/g)).toHaveLength(2);
    expect(text).toMatch(/95 % range/);
    expect(text).toMatch(/Risk level [1-4] of 4/);
    expect(text).toMatch(/Impact preview: if the board approves/);
    expect(text).toMatch(/Statutory clock/);
    expect(squash(text)).toContain(squash('Tier 1 estimate'));
    expect(squash(text)).toContain(squash('Not a substitute for a site survey'));
    expect(squash(text)).toContain(squash('Defer to local law and to licensed professionals'));
    expect(text).toMatch(/\d+ m/); // the scale bar
    for (const s of await secrets(false)) expect(text.includes(s), `pack PDF contains "${s}"`).toBe(false);
  });
});

describe('the public decision notice', () => {
  it('holds the register content and both hashes, is public, and names no applicant, owner, member or comment', async () => {
    const item = itemOf(a.id);
    const packB = () =>
      api('GET', `/api/meetings/${meeting.id}/items/${itemOf(b.id).id}/pack`, { session: board }).then((r) => r.body);
    const committedBefore = (await packB()).impact.budget.committedT;
    for (const who of [board, chair])
      expect((await vote(who, meeting.id, item.id, 'approve-with-conditions', COMMENT)).status).toBe(200);
    const d = await decide(chair, meeting.id, item.id, {
      outcome: 'approved-with-conditions',
      conditions: [CONDITION],
    });
    expect(d.status).toBe(201);
    const seq = d.body.registerSeq as number;

    const res = await fetch(`${BASE_URL}/api/register/${seq}/notice.pdf`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    const text = await pdfText(res);
    const entry = (await api('GET', `/api/register/${seq}`)).body;
    expect(text).toContain(a.reference);
    expect(text).toContain('Approved with conditions');
    expect(squash(text)).toContain(squash(CONDITION.text));
    expect(squash(text)).toContain(entry.hash);
    expect(squash(text)).toContain(entry.prevHash);
    expect(squash(text)).toContain(entry.headHash);
    expect(squash(text)).toContain(squash('Tier 1 estimate'));
    for (const s of await secrets()) expect(text.includes(s), `notice contains "${s}"`).toBe(false);

    // The other item's pack now counts this approval in the budget of the same start year (register figures to 3 decimals).
    const after = await packB();
    expect(after.impact.budget.year).toBe(entry.content.proposal.startYear);
    expect(after.impact.budget.committedT).toBeCloseTo(committedBefore + entry.content.figures.co2eTotal, 6);
    expect((await fetch(`${BASE_URL}/api/register/999999/notice.pdf`)).status).toBe(404);
    const page = await (await fetch(`${BASE_URL}/register/${seq}`)).text();
    expect(page).toContain(`/api/register/${seq}/notice.pdf`);
  });
});
