/**
 * Encode the demo elevation model as a single-band Float32 GeoTIFF with geotiff.js's writer.
 */
import { writeArrayBuffer, type GeotiffWriterMetadata } from 'geotiff';
import { CELL_SIZE_M, CRS_EPSG, GRID_HEIGHT, GRID_WIDTH, NODATA_VALUE, ORIGIN_X, ORIGIN_Y } from './scenario-constants';

/**
 * geotiff.js 3.0.5 writes its whole tag directory into the first 1000 bytes of the file and puts
 * the pixels right after; a longer directory would be overwritten by pixels without an error.
 * So the description is kept short and checked.
 */
const MAX_DESCRIPTION_CHARS = 300;

/**
 * The GeoTIFF bytes of the elevation model: north-up, PixelIsArea, EPSG:7854, tie point at the
 * north-west corner, square cells, GDAL nodata tag, and an ImageDescription.
 *
 * GeoKeys per the OGC GeoTIFF standard 1.1 (OGC 19-008r4): GTModelTypeGeoKey 1 (projected),
 * GTRasterTypeGeoKey 1 (PixelIsArea), ProjectedCSTypeGeoKey 7854. Nodata as the GDAL_NODATA
 * ASCII tag 42113 (GDAL GeoTIFF driver documentation).
 *
 * @param data - Float32 heights, row-major, `GRID_WIDTH` × `GRID_HEIGHT`
 * @param description - ImageDescription text, ASCII, at most 300 characters
 * @throws Error if the grid has the wrong size or the description is too long or not ASCII
 */
export function encodeElevationGeoTiff(data: Float32Array, description: string): ArrayBuffer {
  if (data.length !== GRID_WIDTH * GRID_HEIGHT) {
    throw new Error(`expected ${GRID_WIDTH * GRID_HEIGHT} cells, got ${data.length}`);
  }
  if (description.length > MAX_DESCRIPTION_CHARS || !/^[\x20-\x7e]*$/.test(description)) {
    throw new Error(`ImageDescription must be printable ASCII of at most ${MAX_DESCRIPTION_CHARS} characters`);
  }
  // ImageDescription (tag 270) is known to the writer but missing from its metadata type.
  const metadata: GeotiffWriterMetadata & { ImageDescription: string } = {
    width: GRID_WIDTH,
    height: GRID_HEIGHT,
    BitsPerSample: [32],
    SampleFormat: [3],
    SamplesPerPixel: [1],
    PhotometricInterpretation: [1],
    ImageDescription: description,
    ModelPixelScale: [CELL_SIZE_M, CELL_SIZE_M, 0],
    ModelTiepoint: [0, 0, 0, ORIGIN_X, ORIGIN_Y, 0],
    GTModelTypeGeoKey: 1,
    GTRasterTypeGeoKey: 1,
    ProjectedCSTypeGeoKey: CRS_EPSG,
    GTCitationGeoKey: 'GDA2020 / MGA zone 54',
    GDAL_NODATA: String(NODATA_VALUE),
  };
  return writeArrayBuffer(data, metadata);
}
