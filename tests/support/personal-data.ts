/** Personal data that must never reach a public answer: applicants, owners and holdings, demo staff, and any extra strings a test adds. */
import { DEMO_PEOPLE } from '../../scripts/demo/people';
import { testDb } from './db';
import { APPLICANT } from './proposals';

export async function personalSecrets(extra: string[] = []): Promise<string[]> {
  const applicants = await testDb('proposal').distinct('applicant_name', 'applicant_contact');
  const owners = (await testDb('parcel').whereNotNull('owner_ref').distinct('owner_ref')).map(
    (r) => r.owner_ref as string,
  );
  return [
    APPLICANT.name,
    APPLICANT.contact,
    ...extra,
    ...applicants.flatMap((a) => [a.applicant_name, a.applicant_contact]),
    ...owners,
    ...DEMO_PEOPLE.flatMap((p) => [p.name, p.email]),
  ];
}
