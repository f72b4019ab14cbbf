import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { validateStyleMin } from '@maplibre/maplibre-gl-style-spec';
import type { LayerSpecification, StyleSpecification } from 'maplibre-gl';
import { beforeAll, describe, expect, it } from 'vitest';
import { createExtentFeatures } from '../../../src/components/map/extent';
import { PROPERTY_EXTENT_SOURCE_ID, propertyExtentLayers } from '../../../src/components/map/layers';
import { BASE_FIRST_LABEL_LAYER_ID, createBaseStyle } from '../../../src/components/map/style';
import { decodeGlyphPbf } from './glyph-pbf';

const projectRoot = resolve(import.meta.dirname, '../../..');
const glyphsDir = join(projectRoot, 'public/glyphs');

/** The base style plus the property-extent source and layers the island adds at run time. */
function styleWithExtent(): StyleSpecification {
  const base = createBaseStyle();
  return {
    ...base,
    sources: {
      ...base.sources,
      [PROPERTY_EXTENT_SOURCE_ID]: { type: 'geojson', data: createExtentFeatures([142.1, -31.2, 142.2, -31.1], 'Saltbush Rise') },
    },
    layers: [...base.layers, ...propertyExtentLayers],
  };
}

function textFontStacks(layers: LayerSpecification[]): string[] {
  const stacks = new Set<string>();
  for (const layer of layers) {
    if (layer.type !== 'symbol') continue;
    const font = layer.layout?.['text-font'];
    expect(Array.isArray(font), `${layer.id} names its fonts as a plain array`).toBe(true);
    stacks.add((font as string[]).join(','));
  }
  return [...stacks];
}

/** The range file MapLibre asks for when it needs `codePoint`: 256 code points per file. */
function rangeFile(fontstack: string, codePoint: number): string {
  const start = Math.floor(codePoint / 256) * 256;
  return join(glyphsDir, fontstack, `${start}-${start + 255}.pbf`);
}

beforeAll(() => {
  // A no-op (well under a second) when the glyphs are newer than the fonts and the script.
  execFileSync(process.execPath, [join(projectRoot, 'scripts/build-glyphs.mjs')], { cwd: projectRoot, stdio: 'pipe', timeout: 60_000 });
}, 90_000);

describe('createBaseStyle', () => {
  it('validates against the MapLibre style specification, with the extent layers added', () => {
    expect(validateStyleMin(createBaseStyle())).toEqual([]);
    expect(validateStyleMin(styleWithExtent())).toEqual([]);
  });

  it('references no http(s) URL: no tile host, style, sprite, glyph or font server', () => {
    const style = styleWithExtent();
    expect(JSON.stringify(style)).not.toMatch(/https?:|\/\//i);
    expect(style.glyphs).toBe('/glyphs/{fontstack}/{range}.pbf');
    expect(style.sprite).toBeUndefined();
    for (const [id, source] of Object.entries(style.sources)) {
      expect(source.type, `source ${id}`).toBe('geojson');
      expect(typeof (source as { data: unknown }).data, `source ${id} has its data inline`).toBe('object');
    }
  });

  it('has labels, so text rendering is exercised, all above BASE_FIRST_LABEL_LAYER_ID', () => {
    const layers = createBaseStyle().layers;
    const firstLabel = layers.findIndex((layer) => layer.type === 'symbol');
    expect(firstLabel).toBeGreaterThan(0);
    expect(layers[firstLabel]?.id).toBe(BASE_FIRST_LABEL_LAYER_ID);
    expect(layers.slice(firstLabel).every((layer) => layer.type === 'symbol')).toBe(true);
  });

  it('returns a fresh object each call, so callers may not share mutable state by accident', () => {
    expect(createBaseStyle()).not.toBe(createBaseStyle());
    expect(createBaseStyle()).toEqual(createBaseStyle());
  });

  it('rejects a graticule bbox that is not [west, south, east, north]', () => {
    expect(() => createBaseStyle({ graticuleBboxWgs84: [150, -30, 140, -20] })).toThrow(RangeError);
  });
});

describe('glyphs built by scripts/build-glyphs.mjs', () => {
  const stacks = textFontStacks(styleWithExtent().layers);

  it('exist on disk for every text-font stack the style uses, for every range MapLibre may ask for', () => {
    expect(stacks.sort()).toEqual(['Noto Sans Bold', 'Noto Sans Regular']);
    for (const stack of stacks) {
      // Every range is written (empty ones too), because a 404 fails a whole tile's labels.
      for (let start = 0; start < 65536; start += 256) {
        expect(existsSync(join(glyphsDir, stack, `${start}-${start + 255}.pbf`)), `${stack} ${start}`).toBe(true);
      }
    }
  });

  it.each(['Noto Sans Regular', 'Noto Sans Bold'])('%s 0-255 decodes and holds a real glyph for "A"', (stack) => {
    const decoded = decodeGlyphPbf(readFileSync(join(glyphsDir, stack, '0-255.pbf')));
    expect(decoded).toHaveLength(1);
    expect(decoded[0]?.range).toBe('0-255');
    const glyphs = decoded[0]?.glyphs ?? [];
    const a = glyphs.find((g) => g.id === 'A'.codePointAt(0));
    expect(a).toBeDefined();
    if (!a) return;
    expect(a.width).toBeGreaterThan(5);
    expect(a.height).toBeGreaterThan(5);
    expect(a.advance).toBeGreaterThan(5);
    // An SDF bitmap has a 3-pixel border on every side (glyphs.proto).
    expect(a.bitmapBytes).toBe((a.width + 6) * (a.height + 6));
    // Printable ASCII is all there, and no code point appears twice after merging subsets.
    for (let cp = 0x21; cp <= 0x7e; cp++) expect(glyphs.some((g) => g.id === cp), `U+${cp.toString(16)}`).toBe(true);
    expect(new Set(glyphs.map((g) => g.id)).size).toBe(glyphs.length);
  });

  it('cover every character the base style prints and common Latin text', () => {
    const sample = '0123456789.,°–—’ NSEW Saltbush Rise Ōtāhuhu Ærø Łódź Đồng Tháp';
    for (const stack of stacks) {
      for (const char of sample) {
        const codePoint = char.codePointAt(0) ?? 0;
        const glyphs = decodeGlyphPbf(readFileSync(rangeFile(stack, codePoint))).flatMap((s) => s.glyphs);
        expect(glyphs.some((g) => g.id === codePoint), `${stack} has ${char} (U+${codePoint.toString(16)})`).toBe(true);
      }
    }
  });
});
