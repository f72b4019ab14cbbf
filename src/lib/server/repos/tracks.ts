import type { Knex } from 'knex';
import { boundsOf, lineLengthM } from '../../geo/measure';
import type { ImportedFile } from '../../geo/import-lines';
import { db } from '../db';
import { NotFoundError } from '../http';
import { recordAudit } from './audit-log';
import type { Track } from '../../schemas/tracks';
import { createPaddocks } from './paddocks';

export type { Track };

type TrackRow = { id: number; property_id: number; name: string; kind: Track['kind']; source_file: string; description: string; geometry: string; length_m: number };

const rowToTrack = (row: TrackRow): Track => ({
  id: row.id,
  name: row.name,
  kind: row.kind,
  sourceFile: row.source_file,
  description: row.description,
  coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates,
  lengthM: row.length_m,
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

export async function listTracks(propertyId: number, trx: Knex = db()): Promise<Track[]> {
  return (await trx<TrackRow>('tracks').where({ property_id: propertyId }).orderBy('id')).map(rowToTrack);
}

export async function getTrack(propertyId: number, id: number, trx: Knex = db()): Promise<Track> {
  const row = await trx<TrackRow>('tracks').where({ id, property_id: propertyId }).first();
  if (!row) throw new NotFoundError('track');
  return rowToTrack(row);
}

export async function deleteTrack(propertyId: number, id: number, userId: number): Promise<void> {
  await db().transaction(async (trx) => {
    const track = await getTrack(propertyId, id, trx);
    await trx('tracks').where({ id, property_id: propertyId }).delete();
    await recordAudit({ propertyId, userId, action: 'track.delete', entityType: 'track', entityId: id, detail: { name: track.name, sourceFile: track.sourceFile } }, trx);
  });
}
