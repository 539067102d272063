/**
 * The register's integrity checks shared by uploads, drawing and boundary edits: overlaps and
 * near-duplicates within a file and against the register (tolerances from the settings), and
 * the same checks repeated inside the save, under the register lock, so that two saves racing
 * each other cannot both land (src/lib/db/parcel-integrity.ts).
 */
import type { MultiPolygon } from 'geojson';
import type { Db } from '../db/client';
import * as integrity from '../db/parcel-integrity';
import { overlapIssue, type OverlapTolerance } from '../gis/overlap';
import type { ValidationIssue } from '../gis/validate';
import { HttpError } from '../http/errors';

const label = (idx: number, reference: string | null) => `Feature ${idx + 1}${reference ? ` (${reference})` : ''}`;
const lower = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/** At validation: overlaps with the register, then within the file; errors reject the feature. */
export async function checkStagedOverlaps(trx: Db, stagingId: string, tolerance: OverlapTolerance): Promise<void> {
  const found = new Map<number, ValidationIssue[]>();
  const add = (idx: number, issue: ValidationIssue | null) =>
    issue && found.set(idx, [...(found.get(idx) ?? []), issue]);
  for (const p of await integrity.stagedRegisterPairs(trx, stagingId))
    add(p.idx, overlapIssue(p, tolerance, label(p.idx, p.reference), `parcel ${p.parcel} in the register`));
  for (const p of await integrity.stagedPairs(trx, stagingId))
    add(p.b, overlapIssue(p, tolerance, label(p.b, p.refB), lower(label(p.a, p.refA))));
  await integrity.addStagedIssues(
    trx,
    stagingId,
    [...found].map(([idx, issues]) => ({ idx, issues, reject: issues.some((i) => i.severity === 'error') })),
  );
}

/**
 * Inside the save, under the register lock: a reference, a boundary or an overlap above the
 * tolerance that another save landed after validation refuses the whole save (409).
 */
export async function recheckStagedInSave(trx: Db, stagingId: string, tolerance: OverlapTolerance): Promise<void> {
  await integrity.lockParcelRegister(trx);
  const problems: string[] = [];
  for (const t of await integrity.stagedRegisterTwins(trx, stagingId)) {
    problems.push(
      t.why === 'reference'
        ? `reference "${t.reference}" is now taken by parcel ${t.parcel}`
        : `${lower(label(t.idx, t.reference))} has the same boundary as parcel ${t.parcel}`,
    );
  }
  for (const p of await integrity.stagedRegisterPairs(trx, stagingId)) {
    const issue = overlapIssue(p, tolerance, label(p.idx, p.reference), `parcel ${p.parcel}`);
    if (issue?.severity === 'error') problems.push(lower(issue.message.replace(/\.$/, '')));
  }
  if (problems.length) {
    const more = problems.length > 3 ? ` and ${problems.length - 3} more` : '';
    throw new HttpError(
      'CONFLICT',
      `Another save changed the register after this upload was validated: ${problems.slice(0, 3).join('; ')}${more}. Validate again to see the report.`,
    );
  }
}

/**
 * A drawn or edited boundary, under the register lock: a near-duplicate or an overlap above the
 * tolerance is refused (409, naming the parcel and the area); smaller overlaps come back as warnings.
 */
export async function checkBoundaryAgainstRegister(
  trx: Db,
  geometry: MultiPolygon,
  tolerance: OverlapTolerance,
  exceptId?: number,
): Promise<string[]> {
  await integrity.lockParcelRegister(trx);
  const issues = (await integrity.geometryRegisterPairs(trx, geometry, exceptId))
    .map((p) => overlapIssue(p, tolerance, 'The boundary', `parcel ${p.parcel}`))
    .filter((i): i is ValidationIssue => i !== null);
  const errors = issues.filter((i) => i.severity === 'error');
  if (errors.length)
    throw new HttpError(
      'CONFLICT',
      errors.map((e) => e.message).join(' '),
      errors.map((e) => ({ path: ['geometry'], message: e.message })),
    );
  return issues.map((i) => i.message);
}
