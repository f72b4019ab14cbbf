// Loads the invented demo property "Saltbush Rise" (data-samples/) with one account per role.
// Safe to run again: existing demo accounts and the property are left as they are.
import { copyFileSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { importLines } from '../src/lib/geo/import-lines';
import { fenceLineInputSchema } from '../src/lib/schemas/plan';
import { createFenceLine } from '../src/lib/server/repos/fence-lines';
import { storeImportedFile } from '../src/lib/server/repos/tracks';
import { dataPath } from '../src/lib/server/storage';
import { registerElevationModel } from '../src/lib/server/terrain/accept-elevation-model';
import type { IfdTableInput } from '../src/lib/schemas/crossing';
import { updatePropertySettings, type PriceItem } from '../src/lib/server/repos/property-settings';
import { db } from '../src/lib/server/db';
import { hashPassword } from '../src/lib/server/passwords';
import { addMember } from '../src/lib/server/repos/memberships';
import { createProperty } from '../src/lib/server/repos/properties';
import { createUser, findCredentials } from '../src/lib/server/repos/users';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';

type Manifest = {
  name: string;
  region: string;
  crs: string;
  extent: { wgs84: [number, number, number, number] };
  files: Record<string, string>;
};

/**
 * Loads the demo property; `name` loads a copy under another name (the load benchmark holds
 * several, as a hosted service holds many properties).
 */
export async function seedDemo(name?: string): Promise<void> {
  const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as Manifest;
  if (name) manifest.name = name;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const ids: number[] = [];
  for (const account of DEMO_ACCOUNTS) {
    const existing = await findCredentials(account.email);
    ids.push(existing ? existing.user.id : (await createUser({ ...account, passwordHash })).id);
  }
  const [ownerId] = ids as [number];
  const already = await db()('properties as p')
    .join('memberships as m', 'm.property_id', 'p.id')
    .where({ 'p.name': manifest.name, 'm.user_id': ownerId, 'm.role': 'owner' })
    .first('p.id');
  if (already) {
    console.log(`Demo property "${manifest.name}" is already loaded (id ${already.id}).`);
    return;
  }
  const property = await createProperty(
    { name: manifest.name, region: manifest.region, crs: manifest.crs, extentWgs84: manifest.extent.wgs84 },
    ownerId,
  );
  for (const [index, account] of DEMO_ACCOUNTS.entries()) {
    if (account.role !== 'owner') await addMember(property.id, ids[index]!, account.role, ownerId);
  }
  const managerId = ids[DEMO_ACCOUNTS.findIndex((account) => account.role === 'manager')]!;
  await loadSampleFiles(property.id, managerId);
  // Invented rainfall table and prices (data-samples/*.json say so), so crossings design at once.
  const ifd = JSON.parse(readFileSync('data-samples/saltbush-rise-ifd.json', 'utf8')) as IfdTableInput & { invented: string };
  const prices = JSON.parse(readFileSync('data-samples/saltbush-rise-prices.json', 'utf8')) as { labour: { ratePerDayCents: number; metresPerDay: number }; items: PriceItem[] };
  await updatePropertySettings(
    property.id,
    {
      ifdTable: { aepPercent: ifd.aepPercent, durationsMin: ifd.durationsMin, intensitiesMmH: ifd.intensitiesMmH, source: ifd.source },
      priceList: prices.items,
      designSettings: { labourRatePerDayCents: prices.labour.ratePerDayCents, metresPerDay: prices.labour.metresPerDay },
    },
    0,
    managerId,
  );
  console.log(`Loaded the demo property "${manifest.name}" (id ${property.id}) with ${DEMO_ACCOUNTS.length} demo accounts.`);
  console.log('Its elevation model is queued: the server runs the terrain when it starts.');
}

/** The invented survey of the demo property: GPS tracks, the planned subdivision, the elevation model. */
async function loadSampleFiles(propertyId: number, managerId: number): Promise<void> {
  for (const file of ['saltbush-rise-old-boundary.gpx', 'saltbush-rise-creek.gpx']) {
    await storeImportedFile(propertyId, file, importLines(readFileSync(`data-samples/${file}`, 'utf8')), managerId);
  }
  const subdivision = importLines(readFileSync('data-samples/saltbush-rise-subdivision.kml', 'utf8'));
  for (const line of subdivision.lines) {
    await createFenceLine(propertyId, fenceLineInputSchema.parse({ name: line.name, coordinates: line.coordinates }), managerId);
  }
  await storeImportedFile(propertyId, 'saltbush-rise-subdivision.kml', { ...subdivision, lines: [] }, managerId);
  const source = 'data-samples/saltbush-rise-dem.tif';
  const tempFile = dataPath('uploads/incoming/demo-seed.part');
  mkdirSync(path.dirname(tempFile), { recursive: true });
  copyFileSync(source, tempFile);
  await registerElevationModel({ propertyId, userId: managerId, name: path.basename(source), tempFile, sizeBytes: statSync(source).size });
}
