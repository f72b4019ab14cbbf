// Gives each unit test file its own data folder (and so its own SQLite file) before any module
// reads the configuration.
import { mkdtempSync } from 'node:fs';
import fc from 'fast-check';
import { tmpdir } from 'node:os';
import path from 'node:path';

process.env.DATA_DIR = mkdtempSync(path.join(tmpdir(), 'gullyline-unit-'));
process.env.DATABASE_URL = '';
process.env.NODE_ENV = 'test';

// Property tests run the same cases on every machine, so a CI failure can be replayed; set
// FC_SEED to another number to explore other cases.

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261202) });
