import { PNG } from 'pngjs';

/** Longest side of the map image; larger models are shown at a coarser step (browsers cap textures). */
const MAX_SIDE = 4096;

/**
 * The hillshade as a grey-and-alpha PNG for the map: grey from the hillshade, fully transparent
 * where it is nodata (0). Models wider than 4096 cells are sampled every n-th cell.
 */
export function encodeHillshadePng(hillshade: Uint8Array, width: number, height: number): Buffer {
  const step = Math.ceil(Math.max(width, height) / MAX_SIDE);
  const outWidth = Math.ceil(width / step);
  const outHeight = Math.ceil(height / step);
  const png = new PNG({ width: outWidth, height: outHeight, colorType: 4, inputColorType: 6, inputHasAlpha: true });
  for (let row = 0; row < outHeight; row++) {
    for (let col = 0; col < outWidth; col++) {
      const grey = hillshade[row * step * width + col * step]!;
      const at = (row * outWidth + col) * 4;
      png.data[at] = grey;
      png.data[at + 1] = grey;
      png.data[at + 2] = grey;
      png.data[at + 3] = grey === 0 ? 0 : 255;
    }
  }
  return PNG.sync.write(png, { colorType: 4, inputColorType: 6, inputHasAlpha: true });
}
