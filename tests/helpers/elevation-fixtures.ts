// Elevation model files for tests of bad input, shared by the unit and API suites.

/**
 * A 278-byte little-endian classic TIFF whose header declares a 200 000 × 200 000 Float32 image
 * in EPSG:7854 with 4 bytes of pixels: TIFF 6.0 header and IFD (13 entries, sorted by tag), then
 * ModelPixelScale, ModelTiepoint and the GeoKey directory, then the pixels.
 */
export function oversizedTiff(): Uint8Array {
  const bytes = new Uint8Array(278);
  const view = new DataView(bytes.buffer);
  bytes.set([0x49, 0x49], 0); // "II": little-endian
  view.setUint16(2, 42, true);
  view.setUint32(4, 8, true);
  const SHORT = 3;
  const LONG = 4;
  const DOUBLE = 12;
  const entries: [tag: number, type: number, count: number, value: number][] = [
    [256, LONG, 1, 200_000], // ImageWidth
    [257, LONG, 1, 200_000], // ImageLength
    [258, SHORT, 1, 32], // BitsPerSample
    [259, SHORT, 1, 1], // Compression: none
    [262, SHORT, 1, 1], // PhotometricInterpretation: BlackIsZero
    [273, LONG, 1, 274], // StripOffsets
    [277, SHORT, 1, 1], // SamplesPerPixel
    [278, LONG, 1, 200_000], // RowsPerStrip
    [279, LONG, 1, 4], // StripByteCounts
    [339, SHORT, 1, 3], // SampleFormat: IEEE float
    [33550, DOUBLE, 3, 170], // ModelPixelScale → offset
    [33922, DOUBLE, 6, 194], // ModelTiepoint → offset
    [34735, SHORT, 16, 242], // GeoKeyDirectory → offset
  ];
  view.setUint16(8, entries.length, true);
  entries.forEach(([tag, type, count, value], i) => {
    const at = 10 + i * 12;
    view.setUint16(at, tag, true);
    view.setUint16(at + 2, type, true);
    view.setUint32(at + 4, count, true);
    if (type === SHORT && count === 1) view.setUint16(at + 8, value, true);
    else view.setUint32(at + 8, value, true);
  });
  view.setUint32(10 + entries.length * 12, 0, true); // no next IFD; the IFD ends at byte 170
  [5, 5, 0].forEach((v, i) => view.setFloat64(170 + i * 8, v, true));
  [0, 0, 0, 560000, 6523000, 0].forEach((v, i) => view.setFloat64(194 + i * 8, v, true));
  // GeoKey directory: version 1.1.0, 3 keys: model type projected, PixelIsArea, EPSG:7854.
  [1, 1, 0, 3, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, 7854].forEach((v, i) => view.setUint16(242 + i * 2, v, true));
  view.setFloat32(274, 150, true);
  return bytes;
}
