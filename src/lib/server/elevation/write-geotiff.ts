import type { GridTransform } from '../../terrain/grid-transform';

/** Sample arrays the writer stores, with their TIFF BitsPerSample and SampleFormat. */
type Samples = Uint8Array | Uint16Array | Int16Array | Uint32Array | Int32Array | Float32Array | Float64Array;

export interface GeoTiffOptions {
  readonly width: number;
  readonly height: number;
  readonly transform: GridTransform;
  /** EPSG code of the grid's CRS, and whether it is geographic (degrees) or projected. */
  readonly epsg: number;
  readonly geographic: boolean;
  /** Written as the GDAL_NODATA tag when given. */
  readonly nodata?: number;
  /** ImageDescription, ASCII. */
  readonly description?: string;
}

// TIFF 6.0 field types.
const SHORT = 3;
const LONG = 4;
const ASCII = 2;
const DOUBLE = 12;

/**
 * Encodes one band as an uncompressed, little-endian, north-up GeoTIFF that GDAL and geotiff.js
 * read (TIFF 6.0, Adobe 1992; GeoTIFF, OGC 19-008r4: ModelPixelScale, ModelTiepoint and the
 * GeoKey directory; nodata as GDAL's GDAL_NODATA tag 42113). Rows are stored in strips of about
 * 64 KB so readers can fetch part of the file.
 *
 * Our own writer rather than geotiff.js's: that one converts every value through a new DataView
 * (seconds per million cells) and must fit its tag directory in 1000 bytes.
 *
 * @throws RangeError when the sample count does not match width × height or the file would
 *   exceed the 4 GB of a classic TIFF
 */
export function encodeGeoTiff(samples: Samples, options: GeoTiffOptions): Uint8Array {
  const { width, height, transform, epsg, geographic } = options;
  if (samples.length !== width * height) throw new RangeError(`expected ${width * height} samples, got ${samples.length}`);
  const bytesPerSample = samples.BYTES_PER_ELEMENT;
  const sampleFormat = samples instanceof Float32Array || samples instanceof Float64Array ? 3 : samples instanceof Int16Array || samples instanceof Int32Array ? 2 : 1;
  const rowBytes = width * bytesPerSample;
  const rowsPerStrip = Math.max(1, Math.floor(65_536 / rowBytes));
  const stripCount = Math.ceil(height / rowsPerStrip);

  const geoKeys = [
    1, 1, 0, 3,
    1024, 0, 1, geographic ? 2 : 1, // GTModelTypeGeoKey: projected 1, geographic 2
    1025, 0, 1, 1, // GTRasterTypeGeoKey: PixelIsArea
    geographic ? 2048 : 3072, 0, 1, epsg, // GeographicTypeGeoKey or ProjectedCSTypeGeoKey
  ];
  type Entry = { tag: number; type: number; values: number[] | string };
  const entries: Entry[] = [
    { tag: 256, type: LONG, values: [width] },
    { tag: 257, type: LONG, values: [height] },
    { tag: 258, type: SHORT, values: [bytesPerSample * 8] },
    { tag: 259, type: SHORT, values: [1] },
    { tag: 262, type: SHORT, values: [1] },
    ...(options.description ? [{ tag: 270, type: ASCII, values: `${options.description.replace(/[^\x20-\x7e]/g, '?')}\0` }] : []),
    { tag: 273, type: LONG, values: new Array<number>(stripCount).fill(0) }, // patched below
    { tag: 277, type: SHORT, values: [1] },
    { tag: 278, type: LONG, values: [rowsPerStrip] },
    { tag: 279, type: LONG, values: Array.from({ length: stripCount }, (_, i) => Math.min(rowsPerStrip, height - i * rowsPerStrip) * rowBytes) },
    { tag: 284, type: SHORT, values: [1] },
    { tag: 339, type: SHORT, values: [sampleFormat] },
    { tag: 33550, type: DOUBLE, values: [transform.cellSizeX, transform.cellSizeY, 0] },
    { tag: 33922, type: DOUBLE, values: [0, 0, 0, transform.originX, transform.originY, 0] },
    { tag: 34735, type: SHORT, values: geoKeys },
    ...(options.nodata === undefined ? [] : [{ tag: 42113, type: ASCII, values: `${options.nodata}\0` }]),
  ];

  const size = (entry: Entry) => (typeof entry.values === 'string' ? entry.values.length : entry.values.length * (entry.type === DOUBLE ? 8 : entry.type === LONG ? 4 : 2));
  const ifdOffset = 8;
  const ifdBytes = 2 + entries.length * 12 + 4;
  let extraOffset = ifdOffset + ifdBytes;
  const extraAt = new Map<Entry, number>();
  for (const entry of entries) {
    if (size(entry) <= 4) continue;
    extraOffset += extraOffset % 2; // word alignment
    extraAt.set(entry, extraOffset);
    extraOffset += size(entry);
  }
  const pixelOffset = extraOffset + ((8 - (extraOffset % 8)) % 8);
  const total = pixelOffset + samples.byteLength;
  if (total > 0xffffffff) throw new RangeError('the raster is too large for a classic TIFF (4 GB)');
  const stripOffsets = entries.find((entry) => entry.tag === 273)!;
  stripOffsets.values = Array.from({ length: stripCount }, (_, i) => pixelOffset + i * rowsPerStrip * rowBytes);

  const bytes = new Uint8Array(total);
  const view = new DataView(bytes.buffer);
  bytes.set([0x49, 0x49]); // "II": little-endian
  view.setUint16(2, 42, true);
  view.setUint32(4, ifdOffset, true);
  view.setUint16(ifdOffset, entries.length, true);
  entries.forEach((entry, index) => {
    const at = ifdOffset + 2 + index * 12;
    const count = typeof entry.values === 'string' ? entry.values.length : entry.values.length;
    view.setUint16(at, entry.tag, true);
    view.setUint16(at + 2, entry.type, true);
    view.setUint32(at + 4, count, true);
    const target = extraAt.get(entry) ?? at + 8;
    if (extraAt.has(entry)) view.setUint32(at + 8, target, true);
    writeValues(view, target, entry);
  });
  view.setUint32(ifdOffset + 2 + entries.length * 12, 0, true); // no further IFD
  // Typed arrays are in the platform's byte order, little-endian on every platform Node runs on.
  bytes.set(new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength), pixelOffset);
  return bytes;

  function writeValues(target: DataView, at: number, entry: Entry): void {
    if (typeof entry.values === 'string') {
      for (let i = 0; i < entry.values.length; i++) target.setUint8(at + i, entry.values.charCodeAt(i));
      return;
    }
    entry.values.forEach((value, i) => {
      if (entry.type === DOUBLE) target.setFloat64(at + i * 8, value, true);
      else if (entry.type === LONG) target.setUint32(at + i * 4, value, true);
      else target.setUint16(at + i * 2, value, true);
    });
  }
}
