import { ImportError, importLines } from '../geo/import-lines';
import { BadRequestError, DomainError, readTextWithin } from './http';
import { storeImportedFile } from './repos/tracks';

/** Largest GPX or KML file taken, bytes. */
export const MAX_TRACK_FILE_BYTES = 20 * 1024 * 1024;

/**
 * Imports a GPX or KML file sent as the request body: its lines become tracks, its polygons
 * paddocks. A file that cannot be read is refused with the reason, and nothing is stored.
 */
export async function importTrackFile(propertyId: number, userId: number, fileName: string, request: Request) {
  if (/\.kmz$/i.test(fileName)) throw new DomainError(422, 'KMZ files are zipped KML: unzip it (or export KML) and upload the .kml file.', { file: 'KMZ is not read; upload KML.' });
  const text = await readTextWithin(request, MAX_TRACK_FILE_BYTES);
  if (!text.trim()) throw new BadRequestError('The file is empty: choose a GPX or KML file and send it again.');
  let imported;
  try {
    imported = importLines(text);
  } catch (error) {
    if (error instanceof ImportError) throw new DomainError(422, error.message, { file: error.message });
    throw error;
  }
  const stored = await storeImportedFile(propertyId, fileName, imported, userId);
  return { format: imported.format, tracks: stored.trackIds.length, paddocks: stored.paddockIds.length, skipped: imported.skipped };
}
