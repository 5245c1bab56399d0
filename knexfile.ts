// Knex CLI configuration (run through tsx: npm run db:migrate / db:seed).
// The database name comes from MW_DB_NAME, so the same file migrates modewright and modewright_test.
import type { Knex } from 'knex';
import { knexConfig } from './api/db/knex-config';

const config: Knex.Config = knexConfig();

export default config;
