import type { Knex } from 'knex';
import { boundsOf, lineLengthM, orientRing, polygonAreaHa } from '../../geo/measure';
import type { ImportedFile } from '../../geo/import-lines';
import { db } from '../db';
import { NotFoundError } from '../http';
import { recordAudit } from './audit-log';

export type Track = { id: number; name: string; kind: 'track' | 'route' | 'line'; sourceFile: string; description: string; coordinates: [number, number][]; lengthM: number };
export type Paddock = { id: number; name: string; rings: [number, number][][]; areaHa: number };

type TrackRow = { id: number; property_id: number; name: string; kind: Track['kind']; source_file: string; description: string; geometry: string; length_m: number };
type PaddockRow = { id: number; property_id: number; name: string; geometry: string; area_ha: number };

const rowToTrack = (row: TrackRow): Track => ({
  id: row.id,
  name: row.name,
  kind: row.kind,
  sourceFile: row.source_file,
  description: row.description,
  coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates,
  lengthM: row.length_m,
});

const rowToPaddock = (row: PaddockRow): Paddock => ({
  id: row.id,
  name: row.name,
  rings: (JSON.parse(row.geometry) as { coordinates: [number, number][][] }).coordinates,
  areaHa: row.area_ha,
});

const bboxColumns = (positions: [number, number][]) => {
  const [minLon, minLat, maxLon, maxLat] = boundsOf(positions);
  return { min_lon: minLon, min_lat: minLat, max_lon: maxLon, max_lat: maxLat };
};

/** Stores an imported file's lines as tracks and its polygons as paddocks, all or nothing. */
export async function storeImportedFile(propertyId: number, sourceFile: string, imported: ImportedFile, userId: number | null, trx?: Knex) {
  const write = async (t: Knex) => {
    const now = new Date().toISOString();
    const trackIds: number[] = [];
    for (const line of imported.lines) {
      const [row] = await t('tracks')
        .insert({
          property_id: propertyId,
          name: line.name.slice(0, 200),
          kind: line.kind,
          source_file: sourceFile.slice(0, 200),
          description: line.description,
          geometry: JSON.stringify({ type: 'LineString', coordinates: line.coordinates }),
          length_m: lineLengthM(line.coordinates),
          ...bboxColumns(line.coordinates),
          created_at: now,
        })
        .returning('id');
      trackIds.push((row as { id: number }).id);
    }
    const paddockIds = await createPaddocks(propertyId, imported.polygons, t);
    await recordAudit({ propertyId, userId, action: 'file.import', entityType: 'file', entityId: null, detail: { sourceFile, tracks: trackIds.length, paddocks: paddockIds.length } }, t);
    return { trackIds, paddockIds };
  };
  return trx ? write(trx) : db().transaction(write);
}

/**
 * Stores paddocks (rings turned to RFC 7946 winding, area on the ellipsoid); the caller records
 * the audit entry, in the same transaction.
 */
export async function createPaddocks(propertyId: number, paddocks: readonly { name: string; rings: [number, number][][] }[], trx: Knex): Promise<number[]> {
  const now = new Date().toISOString();
  const ids: number[] = [];
  for (const paddock of paddocks) {
    const rings = paddock.rings.map((ring, i) => orientRing(ring, i === 0));
    const [row] = await trx('paddocks')
      .insert({
        property_id: propertyId,
        name: paddock.name.slice(0, 120),
        geometry: JSON.stringify({ type: 'Polygon', coordinates: rings }),
        area_ha: polygonAreaHa(rings),
        ...bboxColumns(rings[0]!),
        created_at: now,
      })
      .returning('id');
    ids.push((row as { id: number }).id);
  }
  return ids;
}

export async function listTracks(propertyId: number, trx: Knex = db()): Promise<Track[]> {
  return (await trx<TrackRow>('tracks').where({ property_id: propertyId }).orderBy('id')).map(rowToTrack);
}

export async function getTrack(propertyId: number, id: number, trx: Knex = db()): Promise<Track> {
  const row = await trx<TrackRow>('tracks').where({ id, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('track');
  return rowToTrack(row);
}

export async function listPaddocks(propertyId: number, trx: Knex = db()): Promise<Paddock[]> {
  return (await trx<PaddockRow>('paddocks').where({ property_id: propertyId }).orderBy('id')).map(rowToPaddock);
}
