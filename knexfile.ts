import type { Knex } from 'knex';
import { getConfig } from './src/lib/server/config';
import { sqliteSettings } from './src/lib/server/db';

// Used by the knex CLI (`npm run db:migrate`, `db:rollback`, `db:make`). The server and the tests
// run the same migrations from the bundled list in src/lib/server/migration-source.ts.
const config: Knex.Config = {
  ...sqliteSettings(getConfig().databaseFile),
  migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
};

export default config;
