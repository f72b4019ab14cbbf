import exifr from 'exifr';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { THUMBNAIL_MAX_PX, processPhoto } from '../../../../src/lib/server/inspections/process-photo';

/** A 1200 × 800 JPEG stored on its side (EXIF orientation 6) with a GPS position and a camera make in its EXIF. */
async function jpegWithGps(): Promise<Buffer> {
  return sharp({ create: { width: 1200, height: 800, channels: 3, background: { r: 160, g: 120, b: 80 } } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .withExif({ IFD0: { Make: 'Gullyline test camera' }, IFD3: { GPSLatitudeRef: 'S', GPSLatitude: '31/1 26/1 30/1', GPSLongitudeRef: 'E', GPSLongitude: '141/1 38/1 42/1' } })
    .toBuffer();
}

describe('processPhoto', () => {
  it('the test photo really carries GPS (read back by exifr), so the stripping checks below can fail', async () => {
    const gps = await exifr.gps(await jpegWithGps());
    expect(gps.latitude).toBeCloseTo(-31.441667, 5);
    expect(gps.longitude).toBeCloseTo(141.645, 5);
  });

  it('drops GPS and all other EXIF by default, and turns the pixels upright', async () => {
    const photo = await processPhoto(await jpegWithGps(), false);
    expect(photo.contentType).toBe('image/jpeg');
    expect(photo.locationKept).toBe(false);
    expect(await exifr.gps(photo.bytes)).toBeUndefined();
    expect(await exifr.parse(photo.bytes)).toBeUndefined();
    const meta = await sharp(photo.bytes).metadata();
    // Orientation 6 is a quarter turn: the upright photo is 800 wide and 1200 high, with no tag left to turn it again.
    expect([meta.width, meta.height, photo.width, photo.height]).toEqual([800, 1200, 800, 1200]);
    expect(meta.orientation).toBeUndefined();
    expect(meta.exif).toBeUndefined();
  });

  it('keeps the location when the uploader asks, still upright', async () => {
    const photo = await processPhoto(await jpegWithGps(), true);
    expect(photo.locationKept).toBe(true);
    const gps = await exifr.gps(photo.bytes);
    expect(gps.latitude).toBeCloseTo(-31.441667, 5);
    expect(gps.longitude).toBeCloseTo(141.645, 5);
    const meta = await sharp(photo.bytes).metadata();
    expect([meta.width, meta.height]).toEqual([800, 1200]);
    expect(meta.orientation ?? 1).toBe(1);
  });

  it('makes a JPEG thumbnail at most 320 px on its longer side, without metadata', async () => {
    const photo = await processPhoto(await jpegWithGps(), true);
    const meta = await sharp(photo.thumbnail).metadata();
    expect(meta.format).toBe('jpeg');
    expect(Math.max(meta.width!, meta.height!)).toBe(THUMBNAIL_MAX_PX);
    // 800 × 1200 scaled to 320 high: 213 (or 214) wide.
    expect(Math.abs(meta.width! - (800 * 320) / 1200)).toBeLessThanOrEqual(1);
    expect(await exifr.gps(photo.thumbnail)).toBeUndefined();
  });

  it('does not enlarge a photo smaller than a thumbnail', async () => {
    const small = await sharp({ create: { width: 100, height: 60, channels: 3, background: '#808080' } }).png().toBuffer();
    const photo = await processPhoto(small, false);
    expect(photo.contentType).toBe('image/png');
    expect((await sharp(photo.thumbnail).metadata()).width).toBe(100);
  });

  it('keeps WebP as WebP', async () => {
    const webp = await sharp({ create: { width: 64, height: 64, channels: 3, background: '#336699' } }).webp().toBuffer();
    const photo = await processPhoto(webp, false);
    expect(photo.contentType).toBe('image/webp');
    expect((await sharp(photo.bytes).metadata()).format).toBe('webp');
  });

  it('refuses by content, whatever the name: text, a PDF, a cut-short JPEG, an unreadable HEIC', async () => {
    const jpeg = await jpegWithGps();
    const cases: [string, Uint8Array, RegExp][] = [
      ['text', new TextEncoder().encode('not a photo at all, just words in a file called photo.jpg'), /not a photo we can read/],
      ['pdf', new TextEncoder().encode('%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\n'), /application\/pdf.*JPEG/],
      ['cut short', jpeg.subarray(0, 400), /could not be read|not a photo/],
      // An HEIC file's opening (ISO BMFF ftyp box, brand "heic") with no image after it.
      ['heic', new Uint8Array([0, 0, 0, 24, ...new TextEncoder().encode('ftypheic'), 0, 0, 0, 0, ...new TextEncoder().encode('mif1heic'), 0, 0, 0, 8, 0, 0, 0, 0]), /HEIC.*JPEG/],
    ];
    for (const [name, bytes, message] of cases) {
      const refusal = await processPhoto(bytes, false).then(
        () => null,
        (error: unknown) => error as { status: number; message: string },
      );
      expect(refusal, name).not.toBeNull();
      expect(refusal!.status, name).toBe(415);
      expect(refusal!.message, name).toMatch(message);
    }
  });
});
