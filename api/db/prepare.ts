// Brings a database up to date for `npm start`: waits for MariaDB, runs the pending migrations,
// and loads the demo scenario only when there is nobody in the users table yet (so a developer's
// own changes to the demo rows survive restarts). Run through tsx, which lets Knex import the
// TypeScript migrations and seeds:  npx tsx api/db/prepare.ts
import createKnex from 'knex';
import { loadConfig } from '../config/index';
import { knexConfig } from './knex-config';
import { waitForDb } from './index';

async function main(): Promise<void> {
  const { db } = loadConfig({ sessionSecret: 'unused' });
  const knex = createKnex(knexConfig(db));
  try {
    await waitForDb(knex, db);
    const [, applied] = (await knex.migrate.latest()) as [number, string[]];
    process.stdout.write(
      applied.length > 0
        ? `db: ${db.name}: applied ${applied.length} migration(s)\n`
        : `db: ${db.name}: schema up to date\n`,
    );
    const row = await knex('users').count({ n: '*' }).first();
    if (Number(row?.n ?? 0) === 0) {
      await knex.seed.run();
      process.stdout.write(`db: ${db.name}: loaded the demo scenario\n`);
    } else {
      process.stdout.write(`db: ${db.name}: has people already; demo seeds not re-run\n`);
    }
  } finally {
    await knex.destroy();
  }
}

main().catch((e: unknown) => {
  process.stderr.write(`db: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
