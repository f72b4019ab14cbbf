// Loads the invented demo property "Saltbush Rise" (data-samples/) with one account per role.
// Safe to run again: existing demo accounts and the property are left as they are.
import { readFileSync } from 'node:fs';
import { db } from '../src/lib/server/db';
import { hashPassword } from '../src/lib/server/passwords';
import { addMember } from '../src/lib/server/repos/memberships';
import { createProperty } from '../src/lib/server/repos/properties';
import { createUser, findCredentials } from '../src/lib/server/repos/users';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts';

type Manifest = { name: string; region: string; crs: string; extent: { wgs84: [number, number, number, number] } };

export async function seedDemo(): Promise<void> {
  const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as Manifest;
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
  console.log(`Loaded the demo property "${manifest.name}" (id ${property.id}) with ${DEMO_ACCOUNTS.length} demo accounts.`);
}
