// Seeds the demo scenario when the database has no users yet, so `npm start` on a fresh clone
// comes up with demo data and never overwrites a database someone has been working in.
import knex from 'knex';
import config from '../knexfile';

const db = knex(config);
try {
  const row = await db('users').count({ n: '*' }).first();
  const n = Number(row?.n ?? 0);
  if (n === 0) {
    await db.seed.run();
    console.log('[modewright] demo data seeded');
  } else {
    console.log(`[modewright] database has ${n} users; demo data left as it is`);
  }
} finally {
  await db.destroy();
}
