import type { FileHandle } from 'node:fs/promises';
import { ElevationModelError } from './elevation-model-error';

/** Byte size of each TIFF field type (TIFF 6.0 §2; BigTIFF adds 16–18). */
const FIELD_TYPE_BYTES: Readonly<Record<number, number>> = {
  1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8, 13: 4, 16: 8, 17: 8, 18: 8,
};

const REUPLOAD = 'The upload or copy was probably cut short; upload the complete file again.';

/** Where the first image directory is and how the file is laid out, as checked. */
export interface TiffLayout {
  readonly littleEndian: boolean;
  readonly bigTiff: boolean;
  readonly firstIfdOffset: number;
}

/**
 * Checks, before geotiff.js sees the file, that it starts with a TIFF signature and that its first
 * image directory and every value the directory points to lie inside the file. geotiff.js reads
 * past the end of a file as zeros, so a cut-short file would otherwise decode as garbage.
 *
 * Layout per TIFF 6.0 (Adobe 1992) §2 and the BigTIFF extension (magic 43, 8-byte offsets).
 *
 * @throws ElevationModelError `not-tiff`, `truncated` or `damaged`
 */
export async function checkTiffStructure(handle: FileHandle, fileSize: number): Promise<TiffLayout> {
  const notTiff = new ElevationModelError(
    'not-tiff',
    'This file is not a GeoTIFF: it does not start with the TIFF signature. Export the elevation model as a GeoTIFF (.tif) and upload that file.',
  );
  if (fileSize < 8) throw notTiff;
  const head = await readAt(handle, 0, Math.min(16, fileSize));
  const order = head.getUint16(0, false);
  if (order !== 0x4949 && order !== 0x4d4d) throw notTiff;
  const littleEndian = order === 0x4949;
  const magic = head.getUint16(2, littleEndian);
  if (magic !== 42 && magic !== 43) throw notTiff;
  const bigTiff = magic === 43;
  if (bigTiff && (fileSize < 16 || head.getUint16(4, littleEndian) !== 8)) throw notTiff;

  const firstIfdOffset = bigTiff ? uint64(head, 8, littleEndian) : head.getUint32(4, littleEndian);
  const headerBytes = bigTiff ? 16 : 8;
  if (firstIfdOffset < headerBytes) {
    throw new ElevationModelError('damaged', 'This GeoTIFF is damaged: its header does not point to an image. Export the elevation model again and upload the new file.');
  }
  const countBytes = bigTiff ? 8 : 2;
  const entryBytes = bigTiff ? 20 : 12;
  requireInside(firstIfdOffset + countBytes, fileSize);
  const countView = await readAt(handle, firstIfdOffset, countBytes);
  const entries = bigTiff ? uint64(countView, 0, littleEndian) : countView.getUint16(0, littleEndian);
  if (entries === 0 || entries > 65_535) {
    throw new ElevationModelError('damaged', 'This GeoTIFF is damaged: its image directory is empty. Export the elevation model again and upload the new file.');
  }
  // The entries, then the offset of the next directory.
  requireInside(firstIfdOffset + countBytes + entries * entryBytes + (bigTiff ? 8 : 4), fileSize);
  const directory = await readAt(handle, firstIfdOffset + countBytes, entries * entryBytes);
  const inlineBytes = bigTiff ? 8 : 4;
  for (let e = 0; e < entries; e++) {
    const at = e * entryBytes;
    const size = FIELD_TYPE_BYTES[directory.getUint16(at + 2, littleEndian)];
    if (size === undefined) continue; // an unknown field type is skipped, as TIFF readers do
    const count = bigTiff ? uint64(directory, at + 4, littleEndian) : directory.getUint32(at + 4, littleEndian);
    const bytes = size * count;
    if (bytes <= inlineBytes) continue;
    const valueOffset = bigTiff ? uint64(directory, at + 12, littleEndian) : directory.getUint32(at + 8, littleEndian);
    requireInside(valueOffset + bytes, fileSize);
  }
  return { littleEndian, bigTiff, firstIfdOffset };
}

/**
 * @throws ElevationModelError `truncated` when `end` (exclusive byte offset) lies past the file's end
 */
export function requireInside(end: number, fileSize: number): void {
  if (end > fileSize) {
    throw new ElevationModelError(
      'truncated',
      `This GeoTIFF is incomplete: the file is ${formatCount(fileSize)} bytes long but its contents run to byte ${formatCount(end)}. ${REUPLOAD}`,
    );
  }
}

/** A count with thousands separators, e.g. 40,000,000,000. */
export function formatCount(value: number): string {
  return new Intl.NumberFormat('en-AU', { maximumFractionDigits: 0 }).format(value);
}

async function readAt(handle: FileHandle, position: number, length: number): Promise<DataView> {
  const buffer = new Uint8Array(length);
  const { bytesRead } = await handle.read(buffer, 0, length, position);
  return new DataView(buffer.buffer, 0, bytesRead);
}

function uint64(view: DataView, at: number, littleEndian: boolean): number {
  return Number(view.getBigUint64(at, littleEndian));
}
