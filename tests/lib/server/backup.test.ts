import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fenceLineInputSchema } from '../../../src/lib/schemas/plan';
import {
  BackupError,
  backupFolderName,
  checkIntegrity,
  createBackup,
  isExcludedFromBackup,
  isSafeRelativePath,
  restoreBackup,
} from '../../../src/lib/server/backup';
import { getConfig } from '../../../src/lib/server/config';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { bundledMigrations } from '../../../src/lib/server/migration-source';
import { recordAudit } from '../../../src/lib/server/repos/audit-log';
import { createFenceLine } from '../../../src/lib/server/repos/fence-lines';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';
import { dataPath } from '../../../src/lib/server/storage';
import { registerElevationModel } from '../../../src/lib/server/terrain/accept-elevation-model';

const freshFolder = (label: string) => mkdtempSync(path.join(tmpdir(), `gullyline-${label}-`));

let propertyId = 0;
let storedFile = '';
let backupFolder = '';
let auditRowsDuringBackup = 0;

beforeAll(async () => {
  await ensureMigrated();
  const userId = (await createUser({ email: 'backup@test.example', name: 'Backup', passwordHash: 'hash' })).id;
  propertyId = (await createProperty({ name: 'Backed Up Downs', region: '', crs: 'EPSG:7854' }, userId)).id;
  for (const [name, coordinates] of [
    ['North boundary', [[141.9, -37.1], [141.91, -37.1]]],
    ['Creek crossing', [[141.9, -37.105], [141.905, -37.11], [141.91, -37.11]]],
  ] as const) {
    await createFenceLine(propertyId, fenceLineInputSchema.parse({ name, coordinates }), userId);
  }
  const tempFile = dataPath('uploads/incoming/backup-test.part');
  mkdirSync(path.dirname(tempFile), { recursive: true });
  copyFileSync('data-samples/saltbush-rise-dem.tif', tempFile);
  const accepted = await registerElevationModel({ propertyId, userId, name: 'saltbush-rise-dem.tif', tempFile, sizeBytes: statSync(tempFile).size });
  storedFile = (await db()('elevation_models').where({ id: accepted.elevationModel.id }).first('stored_file')).stored_file as string;
  // An upload still arriving stays out of the backup.
  writeFileSync(dataPath('uploads/incoming/half-sent.part'), 'partial');

  // Writes go on through the app's own connection while the backup copies the database.
  let writing = true;
  const writes = (async () => {
    while (writing) {
      await recordAudit({ propertyId, userId, action: 'test.write', entityType: 'property', entityId: propertyId, detail: {} });
      auditRowsDuringBackup += 1;
      await new Promise((resolve) => setImmediate(resolve));
    }
  })();
  await new Promise((resolve) => setTimeout(resolve, 20));
  try {
    const { dataDir, databaseFile } = getConfig();
    backupFolder = (await createBackup({ dataDir, databaseFile, appVersion: '0.1.0' })).folder;
  } finally {
    writing = false;
    await writes;
  }
}, 60_000);
afterAll(closeDb);

describe('pure helpers', () => {
  it('names backup folders by time, sortable and without colons', () => {
    expect(backupFolderName(new Date('2026-12-02T10:15:30.123Z'))).toBe('2026-12-02T10-15-30Z');
  });

  it('leaves backups, incoming uploads, the database and the secret out', () => {
    const db = new Set(['gullyline.sqlite', 'gullyline.sqlite-wal']);
    expect(isExcludedFromBackup('backups/2026/manifest.json', db)).toBe(true);
    expect(isExcludedFromBackup('uploads/incoming/x.part', db)).toBe(true);
    expect(isExcludedFromBackup('gullyline.sqlite-wal', db)).toBe(true);
    expect(isExcludedFromBackup('auth-secret', db)).toBe(true);
    expect(isExcludedFromBackup('elevation-models/1/source.tif', db)).toBe(false);
    expect(isExcludedFromBackup('terrain-runs/3/hillshade.png', db)).toBe(false);
  });

  it('refuses manifest paths that leave the backup folder', () => {
    expect(isSafeRelativePath('elevation-models/1/source.tif')).toBe(true);
    for (const bad of ['../etc/passwd', '/etc/passwd', 'a/../../b', 'a//b', 'a\\b']) expect(isSafeRelativePath(bad)).toBe(false);
  });
});

describe('backup while the app writes, then restore', () => {
  it('writes a manifest with the migrations, the files and checksums, and leaves out what does not belong', () => {
    expect(auditRowsDuringBackup).toBeGreaterThan(0);
    const manifest = JSON.parse(readFileSync(path.join(backupFolder, 'manifest.json'), 'utf8'));
    expect(manifest.migrations.length).toBe(readdirSync('migrations').filter((file) => file.endsWith('.ts')).length);
    expect(manifest.files.map((file: { path: string }) => file.path)).toEqual([storedFile]);
    expect(manifest.fileCount).toBe(1);
    expect(manifest.database.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(existsSync(`${backupFolder}.partial`)).toBe(false);
  });

  it('restores into a fresh folder: the property, its fence lines and its file, and an intact database', async () => {
    const target = freshFolder('restored');
    const result = await restoreBackup({ backupDir: backupFolder, dataDir: target, migrationSource: bundledMigrations() });
    expect(result.appliedMigrations).toEqual([]);
    const restoredFile = path.join(target, 'gullyline.sqlite');
    expect(checkIntegrity(restoredFile)).toBe('ok');
    const restored = new Database(restoredFile, { readonly: true });
    try {
      expect(restored.prepare('select name from properties where id = ?').get(propertyId)).toEqual({ name: 'Backed Up Downs' });
      const fences = restored.prepare('select name from fence_lines where property_id = ? order by id').all(propertyId);
      expect(fences).toEqual([{ name: 'North boundary' }, { name: 'Creek crossing' }]);
      const audits = restored.prepare("select count(*) as n from audit_log where action = 'test.write'").get() as { n: number };
      expect(audits.n).toBeGreaterThan(0);
      expect(audits.n).toBeLessThanOrEqual(auditRowsDuringBackup);
    } finally {
      restored.close();
    }
    expect(readFileSync(path.join(target, storedFile)).equals(readFileSync(dataPath(storedFile)))).toBe(true);
    expect(existsSync(path.join(target, 'uploads/incoming/half-sent.part'))).toBe(false);
  });

  it('refuses a backup with one byte changed, and restores nothing', async () => {
    const tampered = freshFolder('tampered');
    const copy = path.join(tampered, 'backup');
    mkdirSync(copy);
    for (const entry of readdirSync(backupFolder, { recursive: true, withFileTypes: true })) {
      if (!entry.isFile()) continue;
      const relative = path.relative(backupFolder, path.join(entry.parentPath, entry.name));
      mkdirSync(path.dirname(path.join(copy, relative)), { recursive: true });
      copyFileSync(path.join(backupFolder, relative), path.join(copy, relative));
    }
    const file = path.join(copy, 'files', storedFile);
    const bytes = readFileSync(file);
    bytes[1000] = bytes[1000]! ^ 0xff;
    writeFileSync(file, bytes);
    const target = freshFolder('from-tampered');
    await expect(restoreBackup({ backupDir: copy, dataDir: target, migrationSource: bundledMigrations() })).rejects.toThrow(
      new BackupError(`The backup is damaged: ${storedFile} does not match its checksum in manifest.json. Nothing was restored; use another backup.`),
    );
    expect(readdirSync(target)).toEqual([]);
  });

  it('refuses a target that holds data unless forced', async () => {
    const target = freshFolder('occupied');
    writeFileSync(path.join(target, 'gullyline.sqlite'), 'someone else’s data');
    await expect(restoreBackup({ backupDir: backupFolder, dataDir: target, migrationSource: bundledMigrations() })).rejects.toThrow(/already holds data.*--force/);
    expect(readFileSync(path.join(target, 'gullyline.sqlite'), 'utf8')).toBe('someone else’s data');
    await restoreBackup({ backupDir: backupFolder, dataDir: target, force: true, migrationSource: bundledMigrations() });
    expect(checkIntegrity(path.join(target, 'gullyline.sqlite'))).toBe('ok');
  });

  it('says so when the folder is not a backup', async () => {
    const notBackup = freshFolder('not-backup');
    await expect(restoreBackup({ backupDir: notBackup, dataDir: freshFolder('t'), migrationSource: bundledMigrations() })).rejects.toThrow(/is not a Gullyline backup: it has no manifest.json/);
  });
});
