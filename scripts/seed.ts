/**
 * Seeds the invented demo scenario into an EMPTY database only: if any user exists, it does
 * nothing, so it can never write over an authority's real data. The people go in one
 * transaction; the demo region (scripts/demo/region.ts) then goes through the app's own upload
 * services, one transaction per step, as an admin and a planner would.
 */
import { hashPassword } from 'better-auth/crypto';
import { recordAudit } from '../src/lib/db/audit';
import { db } from '../src/lib/db/client';
import { insertUser, setPassword } from '../src/lib/db/users';
import { DEMO_PASSWORD, DEMO_PEOPLE } from './demo/people';
import { recomputeScreening } from '../src/lib/services/screening';
import { seedDemoHistory } from './demo/history';
import { seedDemoCompensation } from './demo/compensation';
import { seedDemoProposals } from './demo/proposals';
import { seedDemoRegion } from './demo/region';
import { closeGisPool } from '../src/lib/workers/pool';

async function main(): Promise<void> {
  const [{ n }] = await db('user').count<{ n: number }[]>('* as n');
  if (Number(n) > 0) {
    console.log('seed: the database already has users; demo data not added');
    return;
  }
  await seedPeople();
  const admin = DEMO_PEOPLE.find((p) => p.roles.includes('admin'))!;
  const planner = DEMO_PEOPLE.find((p) => p.roles.includes('planner'))!;
  console.log(`seed: ${await seedDemoRegion(admin.email, planner.email)}`);
  const assessor = DEMO_PEOPLE.find((p) => p.roles.includes('assessor'))!;
  console.log(`seed: ${await seedDemoProposals(planner.email, assessor.email)}`);
  const board = DEMO_PEOPLE.find((p) => p.roles.includes('board') && !p.roles.includes('chair'))!;
  const chair = DEMO_PEOPLE.find((p) => p.roles.includes('chair'))!;
  console.log(
    `seed: ${await seedDemoHistory({ planner: planner.email, assessor: assessor.email, board: board.email, chair: chair.email })}`,
  );
  const member = (role: 'board' | 'chair') =>
    DEMO_PEOPLE.find((p) => p.roles.includes(role) && (role === 'chair' || !p.roles.includes('chair')))!.email;
  console.log(
    `seed: ${await seedDemoCompensation({ planner: planner.email, assessor: assessor.email, board: member('board'), chair: member('chair') })}`,
  );
  const screened = await db.transaction((trx) => recomputeScreening(trx, null, 'Demo scenario seeded'));
  console.log(`seed: screening map of ${screened.screened} permanent-grassland parcels computed in ${screened.ms} ms`);
}

async function seedPeople(): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (trx) => {
    for (const p of DEMO_PEOPLE) {
      const id = crypto.randomUUID();
      await insertUser(trx, { id, ...p });
      await setPassword(trx, id, hash);
      await recordAudit(trx, {
        actorId: null,
        action: 'user.seed',
        entityType: 'user',
        entityId: id,
        details: { email: p.email },
      });
    }
  });
  console.log(`seed: demo scenario added (${DEMO_PEOPLE.length} people)`);
}

try {
  await main();
} catch (err) {
  console.error(`seed: ${(err as Error).message}`);
  process.exitCode = 1;
} finally {
  await closeGisPool();
  await db.destroy();
}
