// Gives each unit test file its own data folder (and so its own SQLite file) before any module
// reads the configuration.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

process.env.DATA_DIR = mkdtempSync(path.join(tmpdir(), 'gullyline-unit-'));
process.env.DATABASE_URL = '';
process.env.NODE_ENV = 'test';
