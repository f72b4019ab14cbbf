import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { changeLogQuerySchema, describeChange, groupOfAction } from '../../../src/lib/schemas/audit-log';
import { closeDb, ensureMigrated } from '../../../src/lib/server/db';
import { listAuditAuthors, listAuditForProperty, recordAudit } from '../../../src/lib/server/repos/audit-log';
import { addMember } from '../../../src/lib/server/repos/memberships';
import { createProperty } from '../../../src/lib/server/repos/properties';
import { createUser } from '../../../src/lib/server/repos/users';

let propertyId = 0;
let ownerId = 0;
let managerId = 0;

beforeAll(async () => {
  await ensureMigrated();
  ownerId = (await createUser({ email: 'log-owner@test.example', name: 'Olive Owner', passwordHash: 'hash' })).id;
  managerId = (await createUser({ email: 'log-manager@test.example', name: 'Mal Manager', passwordHash: 'hash' })).id;
  propertyId = (await createProperty({ name: 'Log Creek', region: '', crs: 'EPSG:7854' }, ownerId)).id;
  await addMember(propertyId, managerId, 'manager', ownerId);
  await recordAudit({ propertyId, userId: managerId, action: 'fence_line.create', entityType: 'fence_line', entityId: 1, detail: { name: 'River paddock north' } });
  await recordAudit({ propertyId, userId: managerId, action: 'fence_line.update', entityType: 'fence_line', entityId: 1, detail: { fields: ['name', 'wireSpec'] } });
  await recordAudit({ propertyId, userId: ownerId, action: 'settings.update', entityType: 'property', entityId: propertyId, detail: { parts: ['priceList'] } });
  await recordAudit({ propertyId, action: 'terrain_run.succeed', entityType: 'terrain_run', entityId: 4, detail: { drainageLines: 12 } });
  // Another property's entry never shows here.
  const other = await createProperty({ name: 'Elsewhere', region: '', crs: 'EPSG:7854' }, ownerId);
  await recordAudit({ propertyId: other.id, userId: ownerId, action: 'fence_line.create', entityType: 'fence_line', entityId: 9, detail: { name: 'Not here' } });
});
afterAll(closeDb);

describe('the change log', () => {
  it('lists a property’s changes newest first, and only that property’s', async () => {
    const actions = (await listAuditForProperty(propertyId)).map((e) => e.action);
    expect(actions).toEqual(['terrain_run.succeed', 'settings.update', 'fence_line.update', 'fence_line.create', 'membership.add', 'property.create']);
  });

  it('filters by group, by person and pages by id', async () => {
    expect((await listAuditForProperty(propertyId, { group: 'plan' })).map((e) => e.action)).toEqual(['fence_line.update', 'fence_line.create']);
    // settings.update is stored with entity type "property" but belongs with the property's settings.
    expect((await listAuditForProperty(propertyId, { group: 'property' })).map((e) => e.action)).toEqual(['settings.update', 'property.create']);
    expect((await listAuditForProperty(propertyId, { group: 'people' })).map((e) => [e.action, e.subjectName])).toEqual([['membership.add', 'Mal Manager']]);
    expect((await listAuditForProperty(propertyId, { userId: managerId })).map((e) => [e.action, e.userName])).toEqual([
      ['fence_line.update', 'Mal Manager'],
      ['fence_line.create', 'Mal Manager'],
    ]);
    const firstPage = await listAuditForProperty(propertyId, { limit: 2 });
    const nextPage = await listAuditForProperty(propertyId, { limit: 2, beforeId: firstPage.at(-1)!.id });
    expect(nextPage.map((e) => e.action)).toEqual(['fence_line.update', 'fence_line.create']);
  });

  it('offers the people who made changes as the "who" filter', async () => {
    expect(await listAuditAuthors(propertyId)).toEqual([
      { id: managerId, name: 'Mal Manager' },
      { id: ownerId, name: 'Olive Owner' },
    ]);
  });

  it('describes each change in plain words, and a newer action sensibly', () => {
    expect(describeChange('fence_line.create', { name: 'River paddock north' }, '1')).toBe('Drew fence line “River paddock north”');
    expect(describeChange('fence_line.update', { fields: ['name', 'wireSpec'] }, '1')).toBe('Changed fence line 1: name, wire specification');
    expect(describeChange('membership.change_role', { from: 'crew', to: 'manager' }, '7')).toBe("Changed a person's role from crew to manager");
    expect(describeChange('membership.add', { role: 'crew' }, '7', 'Jess Kowalski')).toBe('Added Jess Kowalski as crew');
    expect(describeChange('plan.import', { sourceFile: 'plan.kml', fenceLines: 3, paddocks: 1 }, null)).toBe('Imported the plan plan.kml (3 fence lines, 1 paddock)');
    expect(describeChange('work_order.item_state', { label: 'North fence', to: 'done', workOrderId: 5, note: 'Tie re-set' }, '9')).toBe('Marked North fence done (work order 5): “Tie re-set”');
    expect(describeChange('fence_line.status', { name: 'North fence', from: 'approved', to: 'building', workOrderId: 5 }, '2')).toBe('Fence line “North fence” went from approved to building (work order 5)');
    expect(describeChange('rain_event.delete', { title: 'March storm' }, '5')).toBe('Rain event 5: delete “March storm”');
    expect(describeChange('rain_event.create', { fellOn: '2026-11-20', rainfallMm: 42, scope: 'property', crossingIds: [3, 4] }, '1')).toBe('Recorded 42 mm of rain on 2026-11-20: 2 crossings to inspect');
    expect(describeChange('inspection_check.update', { crossingId: 4, from: 'not-checked', to: 'tie-reset' }, '8')).toBe('Inspected crossing 4: not checked → tie reset');
    expect(groupOfAction('work_order.send')).toBe('work');
    expect(groupOfAction('inspection_photo.create')).toBe('inspections');
    expect(groupOfAction('something.else')).toBeNull();
  });

  it('reads the filter from a query string and refuses what it does not know', () => {
    expect(changeLogQuerySchema.parse({ what: 'plan', who: '3', before: '' })).toEqual({ what: 'plan', who: 3, before: undefined });
    expect(changeLogQuerySchema.safeParse({ what: 'everything' }).success).toBe(false);
    expect(changeLogQuerySchema.safeParse({ who: '-1' }).success).toBe(false);
  });
});
