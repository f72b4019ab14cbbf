import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../src/lib/server/db';
import { ConflictError, NotFoundError } from '../../../src/lib/server/http';
import { listAuditForProperty } from '../../../src/lib/server/repos/audit-log';
import { addMember, changeRole, findRole, listMembers, removeMember } from '../../../src/lib/server/repos/memberships';
import { createProperty, listPropertiesForUser, updateProperty } from '../../../src/lib/server/repos/properties';
import { createUser, findCredentials } from '../../../src/lib/server/repos/users';

let ownerId = 0;
let crewId = 0;

beforeAll(async () => {
  await ensureMigrated();
  ownerId = (await createUser({ email: 'Owner@Test.example ', name: 'Owner', passwordHash: 'hash' })).id;
  crewId = (await createUser({ email: 'crew@test.example', name: 'Crew', passwordHash: 'hash' })).id;
});
afterAll(closeDb);

describe('users', () => {
  it('stores e-mail addresses lower-cased and refuses a second account for one address', async () => {
    expect((await findCredentials('OWNER@test.example'))?.user.id).toBe(ownerId);
    await expect(createUser({ email: 'owner@test.EXAMPLE', name: 'Again', passwordHash: 'h' })).rejects.toBeInstanceOf(ConflictError);
  });
});

describe('properties and memberships', () => {
  it('creates a property, its owner membership and an audit entry together', async () => {
    const property = await createProperty({ name: 'Saltbush', region: '', crs: 'EPSG:7854' }, ownerId);
    expect(await findRole(property.id, ownerId)).toBe('owner');
    expect((await listPropertiesForUser(ownerId)).map((p) => p.id)).toContain(property.id);
    expect((await listAuditForProperty(property.id)).map((e) => e.action)).toEqual(['property.create']);
  });

  it('leaves nothing behind when creation fails half-way', async () => {
    const before = await db()('properties').count<{ n: number }[]>({ n: '*' });
    await expect(createProperty({ name: 'Ghost', region: '', crs: 'EPSG:7854' }, 987_654)).rejects.toThrow(/FOREIGN KEY/);
    const after = await db()('properties').count<{ n: number }[]>({ n: '*' });
    expect(after[0]!.n).toBe(before[0]!.n);
  });

  it('refuses an update from a stale version', async () => {
    const property = await createProperty({ name: 'Versioned', region: '', crs: 'EPSG:7854' }, ownerId);
    await updateProperty(property.id, { name: 'Versioned 2', version: 1 }, ownerId, 'owner');
    await expect(updateProperty(property.id, { name: 'Lost', version: 1 }, ownerId, 'owner')).rejects.toBeInstanceOf(ConflictError);
    await expect(updateProperty(123_456, { name: 'None', version: 1 }, ownerId, 'owner')).rejects.toBeInstanceOf(NotFoundError);
  });

  it('orders members by role, and keeps the last owner', async () => {
    const property = await createProperty({ name: 'Members', region: '', crs: 'EPSG:7854' }, ownerId);
    await addMember(property.id, crewId, 'crew', ownerId);
    expect((await listMembers(property.id)).map((m) => m.role)).toEqual(['owner', 'crew']);
    await expect(changeRole(property.id, ownerId, 'viewer', ownerId)).rejects.toBeInstanceOf(ConflictError);
    await expect(removeMember(property.id, ownerId, ownerId)).rejects.toBeInstanceOf(ConflictError);
    await changeRole(property.id, crewId, 'owner', ownerId);
    await removeMember(property.id, ownerId, crewId);
    expect(await findRole(property.id, ownerId)).toBeUndefined();
    const actions = (await listAuditForProperty(property.id)).map((e) => e.action);
    expect(actions).toEqual(['membership.remove', 'membership.change_role', 'membership.add', 'property.create']);
  });
});
