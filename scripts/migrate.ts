/** Knex migrations under tsx: `node --import tsx scripts/migrate.ts latest|rollback|reset|status|make NAME`. */
import knexFactory from 'knex';
import config from '../knexfile';

const knex = knexFactory(config);
const [cmd = 'latest', name] = process.argv.slice(2);

/** Reference data that ships with the code (the IPCC factor sets, the default rule set) follows the schema. */
async function syncReferenceData(): Promise<void> {
  const { syncShippedSets } = await import('../src/lib/services/factor-sets');
  const added = await syncShippedSets(knex);
  if (added.length) console.log(`migrate: shipped factor sets added: ${added.join(', ')}`);
  const { syncShippedRuleSets } = await import('../src/lib/services/rule-sets');
  const rules = await syncShippedRuleSets(knex);
  if (rules.length) console.log(`migrate: shipped rule sets added: ${rules.join(', ')}`);
  // The job queue's own schema (pg-boss) and its queues.
  const { installJobQueue } = await import('../src/lib/jobs/queue');
  await installJobQueue(String(config.connection));
}

try {
  if (cmd === 'latest') {
    const [batch, files] = await knex.migrate.latest();
    console.log(files.length ? `migrate: batch ${batch}, ${files.length} migration(s)` : 'migrate: up to date');
    await syncReferenceData();
  } else if (cmd === 'rollback') {
    const [, files] = await knex.migrate.rollback();
    console.log(`migrate: rolled back ${files.length}`);
  } else if (cmd === 'reset') {
    // Drops everything, for the throwaway test database only.
    if (!/_test(_[a-z0-9]+)?$/.test(new URL(String(config.connection)).pathname))
      throw new Error('reset only runs on a *_test or *_test_NAME database');
    await knex.raw('drop schema public cascade; create schema public; drop schema if exists pgboss cascade');
    const [, files] = await knex.migrate.latest();
    console.log(`migrate: reset, ${files.length} migration(s)`);
    await syncReferenceData();
  } else if (cmd === 'status') {
    const [done, pending] = await knex.migrate.list();
    console.log(`migrate: ${done.length} applied, ${pending.length} pending`);
  } else if (cmd === 'make' && name) {
    console.log(await knex.migrate.make(name));
  } else {
    throw new Error('usage: migrate.ts latest|rollback|reset|status|make NAME');
  }
} catch (err) {
  console.error(`migrate: ${(err as Error).message}`);
  process.exitCode = 1;
} finally {
  await knex.destroy();
  const { db } = await import('../src/lib/db/client');
  await db.destroy();
}
