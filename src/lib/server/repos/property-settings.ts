import type { Knex } from 'knex';
import type { IfdTable } from '../../crossings/hydraulics/ifd';
import { designSettingsSchema, type DesignSettings, type IfdTableInput } from '../../schemas/crossing';
import type { PriceListItem } from '../../schemas/price-list';
import { db } from '../db';
import { validateIfdTable } from '../../crossings/hydraulics/ifd';
import { ConflictError, ValidationError } from '../http';
import { recordAudit } from './audit-log';

export type PriceItem = PriceListItem;

export type PropertySettings = {
  designSettings: DesignSettings;
  ifdTable: (IfdTable & { source: string }) | null;
  priceList: PriceItem[];
  version: number;
};

type SettingsRow = { property_id: number; design_settings: string; ifd_table: string | null; price_list: string; version: number };

/** A property's design settings, IFD table and price list (defaults when none are stored). */
export async function getPropertySettings(propertyId: number, trx: Knex = db()): Promise<PropertySettings> {
  const row = await trx<SettingsRow>('property_settings').where({ property_id: propertyId }).first();
  if (!row) return { designSettings: {}, ifdTable: null, priceList: [], version: 0 };
  const parsed = designSettingsSchema.safeParse(JSON.parse(row.design_settings));
  return {
    designSettings: parsed.success ? parsed.data : {},
    ifdTable: row.ifd_table ? (JSON.parse(row.ifd_table) as IfdTableInput) : null,
    priceList: JSON.parse(row.price_list) as PriceItem[],
    version: row.version,
  };
}

/**
 * Changes part of a property's settings; the caller sends the version it read (0 when none were
 * stored yet) and a stale edit is refused.
 */
export async function updatePropertySettings(
  propertyId: number,
  changes: { designSettings?: DesignSettings; ifdTable?: IfdTableInput | null; priceList?: PriceItem[] },
  version: number,
  userId: number | null,
  trx?: Knex,
): Promise<PropertySettings> {
  if (changes.ifdTable) {
    const problems = validateIfdTable(changes.ifdTable);
    if (problems.length) throw new ValidationError({ ifdTable: problems.join(' ') }, 'The IFD table needs attention.');
  }
  const write = async (t: Knex) => {
    const current = await getPropertySettings(propertyId, t);
    if (current.version !== version) throw new ConflictError('Someone changed these settings since you opened them. Reload to see their change, then edit again.');
    const row = {
      design_settings: JSON.stringify(changes.designSettings ?? current.designSettings),
      ifd_table: (changes.ifdTable === undefined ? current.ifdTable : changes.ifdTable) === null ? null : JSON.stringify(changes.ifdTable ?? current.ifdTable),
      price_list: JSON.stringify(changes.priceList ?? current.priceList),
      version: version + 1,
      updated_at: new Date().toISOString(),
    };
    if (version === 0) await t('property_settings').insert({ property_id: propertyId, ...row });
    else await t('property_settings').where({ property_id: propertyId, version }).update(row);
    await recordAudit({ propertyId, userId, action: 'settings.update', entityType: 'property', entityId: propertyId, detail: { parts: Object.keys(changes) } }, t);
    return getPropertySettings(propertyId, t);
  };
  return trx ? write(trx) : db().transaction(write);
}
