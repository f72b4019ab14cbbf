import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { DomainError } from '../http';

/** The longest side of a thumbnail, in pixels. */
export const THUMBNAIL_MAX_PX = 320;
/** Refuse decoding bombs: a phone camera makes at most about 50 megapixels. */
const MAX_INPUT_PIXELS = 120_000_000;

export class UnsupportedPhotoError extends DomainError {
  constructor(message: string) {
    super(415, message);
  }
}

export type ProcessedPhoto = {
  bytes: Buffer;
  contentType: 'image/jpeg' | 'image/png' | 'image/webp';
  extension: 'jpg' | 'png' | 'webp';
  width: number;
  height: number;
  thumbnail: Buffer;
  locationKept: boolean;
};

const SEND_JPEG = 'Send the photo as a JPEG (on an iPhone: Settings → Camera → Formats → Most Compatible).';

/**
 * Checks that the bytes are a photo by their content (never the file name) and re-encodes it:
 * orientation applied, and all metadata dropped unless `keepLocation`, when the camera's EXIF
 * (with its GPS position) is kept. HEIC is read when this server's sharp can decode it.
 * A JPEG, HEIC or HEIF comes out as JPEG, a PNG as PNG, a WebP as WebP; the thumbnail is a JPEG
 * at most {@link THUMBNAIL_MAX_PX} on its longer side, without metadata.
 * @throws UnsupportedPhotoError (415) for anything that is not a readable JPEG, PNG, WebP or HEIC
 */
export async function processPhoto(input: Uint8Array, keepLocation: boolean): Promise<ProcessedPhoto> {
  const type = await fileTypeFromBuffer(input);
  if (!type) throw new UnsupportedPhotoError(`This file is not a photo we can read. ${SEND_JPEG}`);
  const heic = type.mime === 'image/heic' || type.mime === 'image/heif' || type.mime === 'image/heic-sequence' || type.mime === 'image/heif-sequence';
  if (!heic && !['image/jpeg', 'image/png', 'image/webp'].includes(type.mime)) {
    throw new UnsupportedPhotoError(`This file is ${type.mime}, not a photo in JPEG, PNG, WebP or HEIC. ${SEND_JPEG}`);
  }
  const out = type.mime === 'image/png' ? ({ contentType: 'image/png', extension: 'png' } as const) : type.mime === 'image/webp' ? ({ contentType: 'image/webp', extension: 'webp' } as const) : ({ contentType: 'image/jpeg', extension: 'jpg' } as const);
  try {
    // rotate() with no angle turns the pixels upright by the EXIF orientation.
    let pipeline = sharp(input, { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' }).rotate();
    if (keepLocation) pipeline = pipeline.keepExif();
    pipeline = out.extension === 'png' ? pipeline.png() : out.extension === 'webp' ? pipeline.webp({ quality: 85 }) : pipeline.jpeg({ quality: 85, mozjpeg: true });
    const { data, info } = await pipeline.toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(data).flatten({ background: '#ffffff' }).resize(THUMBNAIL_MAX_PX, THUMBNAIL_MAX_PX, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 75 }).toBuffer();
    return { bytes: data, contentType: out.contentType, extension: out.extension, width: info.width, height: info.height, thumbnail, locationKept: keepLocation };
  } catch (error) {
    if (error instanceof DomainError) throw error;
    if (heic) throw new UnsupportedPhotoError(`This server cannot read HEIC photos. ${SEND_JPEG}`);
    throw new UnsupportedPhotoError(`This photo could not be read: it may be damaged or cut short. ${SEND_JPEG}`);
  }
}
