// A backup of the running test server, restored into a fresh folder and served by a second built
// server: the same property, fence lines and uploaded elevation model come back.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { newAccount, TestClient } from '../helpers/api-client';
import { startBuiltServer } from '../helpers/global-server';

const work = mkdtempSync(path.join(tmpdir(), 'gullyline-backup-api-'));
let stopRestored: (() => Promise<void>) | undefined;
afterAll(async () => {
  await stopRestored?.();
  rmSync(work, { recursive: true, force: true });
});

const dbScript = (args: string[], dataDir: string) =>
  execFileSync(process.execPath, ['--import', 'tsx', 'scripts/db.ts', ...args], { env: { ...process.env, DATA_DIR: dataDir, DATABASE_URL: '', NODE_ENV: 'test' }, encoding: 'utf8' });

describe('db:backup of a running server, db:restore into a fresh folder', () => {
  it('serves the same property, fence lines and elevation model from the restored folder', async () => {
    const client = new TestClient();
    const account = newAccount('backup');
    await client.signUp(account);
    await client.signIn(account.email, account.password);
    const propertyId = (await client.json<{ property: { id: number } }>('POST', '/api/properties', { name: 'Restored Ridge', crs: 'EPSG:7854' })).body.property.id;
    for (const name of ['Top fence', 'Creek fence']) {
      const created = await client.json('POST', `/api/properties/${propertyId}/fence-lines`, { name, coordinates: [[141.64, -31.44], [141.65, -31.441]] });
      expect(created.status).toBe(201);
    }
    const dem = readFileSync('data-samples/saltbush-rise-dem.tif');
    const upload = await client.request('POST', `/api/properties/${propertyId}/elevation-models?name=ridge.tif`, new Uint8Array(dem), { 'Content-Type': 'image/tiff' });
    expect(upload.status).toBe(201);
    // The run sets the property's extent when it finishes: read the property after that, not during.
    for (let i = 0; ; i++) {
      const { body } = await client.json<{ elevationModels: { latestRun: { status: string } | null }[] }>('GET', `/api/properties/${propertyId}/elevation-models`);
      if (body.elevationModels.every((model) => model.latestRun && ['succeeded', 'failed', 'cancelled'].includes(model.latestRun.status))) break;
      if (i > 600) throw new Error('the terrain run did not finish in two minutes');
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    const before = {
      property: (await client.json('GET', `/api/properties/${propertyId}`)).body,
      fenceLines: (await client.json('GET', `/api/properties/${propertyId}/fence-lines`)).body,
    };

    expect(before.property).toMatchObject({ property: { name: 'Restored Ridge' } });
    expect((before.fenceLines as { fenceLines: unknown[] }).fenceLines).toHaveLength(2);

    const backup = path.join(work, 'backup');
    expect(dbScript(['backup', backup], inject('dataDir'))).toMatch(/^Backed up .* and \d+ file\(s\)/);
    const restoredDir = path.join(work, 'restored');
    const restoreOutput = dbScript(['restore', backup, '--target', restoredDir], restoredDir);
    expect(restoreOutput).toContain('Integrity check: ok.');

    const restored = await startBuiltServer(restoredDir);
    stopRestored = restored.stop;
    const again = new TestClient(restored.baseUrl);
    const signIn = await again.signIn(account.email, account.password);
    expect(again.signedIn, JSON.stringify(signIn)).toBe(true);
    expect((await again.json('GET', `/api/properties/${propertyId}`)).body).toEqual(before.property);
    expect((await again.json('GET', `/api/properties/${propertyId}/fence-lines`)).body).toEqual(before.fenceLines);
    const models = (await again.json<{ elevationModels: { name: string; id: number }[] }>('GET', `/api/properties/${propertyId}/elevation-models`)).body.elevationModels;
    expect(models.map((model) => model.name)).toEqual(['ridge.tif']);
    expect(readFileSync(path.join(restoredDir, `elevation-models/${models[0]!.id}/source.tif`)).equals(dem)).toBe(true);
  }, 240_000);
});
