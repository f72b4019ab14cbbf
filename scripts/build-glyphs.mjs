#!/usr/bin/env node
// Builds the MapLibre glyph files (signed-distance-field PBFs, 256 code points per file) that
// the map's style loads from `/glyphs/{fontstack}/{range}.pbf`. Everything is built offline from
// the Noto Sans files that @fontsource/noto-sans ships; no font or glyph server is ever reached.
//
// @fontsource splits Noto Sans into per-script subsets (latin, latin-ext, greek, …), each a
// separate WOFF holding only its own characters. fontnik rasterises one font at a time, so each
// 256-code-point range is rendered from every subset that has characters in it and the glyphs
// are merged into one fontstack (the first subset listed wins where subsets overlap).
// fontnik's FreeType reads WOFF (not WOFF2), so the .woff files are used.
//
// Every range 0-255 … 65280-65535 is written, empty ones as a fontstack with no glyphs: MapLibre
// fails the whole tile's labels when a glyph range request answers 404.
//
// Usage: node scripts/build-glyphs.mjs [--force] [--out <dir>]
//   The build is skipped when every output exists and is newer than the font files and this
//   script. --out defaults to public/glyphs.

import { createRequire } from 'node:module';
import { availableParallelism } from 'node:os';
import { mkdir, readFile, rename, stat, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

const require = createRequire(import.meta.url);
/** @type {{ load: Function; range: Function }} */
const fontnik = require('fontnik');

const scriptPath = fileURLToPath(import.meta.url);
const projectRoot = resolve(dirname(scriptPath), '..');
const fontFilesDir = join(dirname(require.resolve('@fontsource/noto-sans/package.json')), 'files');

/** Subsets in priority order. Devanagari is left out: MapLibre cannot shape it without a plugin. */
const SUBSETS = ['latin', 'latin-ext', 'greek', 'greek-ext', 'cyrillic', 'cyrillic-ext', 'vietnamese'];

/** Fontstack names as the style's `text-font` spells them, and the @fontsource weight of each. */
const FONTSTACKS = [
  { name: 'Noto Sans Regular', weight: 400 },
  { name: 'Noto Sans Bold', weight: 700 },
];

const RANGE_SIZE = 256;
const LAST_CODE_POINT = 0xffff;

const { values: args } = parseArgs({
  options: { force: { type: 'boolean', default: false }, out: { type: 'string' } },
});
const outDir = resolve(projectRoot, args.out ?? 'public/glyphs');

/** @returns {{ start: number, end: number }[]} */
function allRanges() {
  const ranges = [];
  for (let start = 0; start <= LAST_CODE_POINT; start += RANGE_SIZE) {
    ranges.push({ start, end: Math.min(start + RANGE_SIZE - 1, LAST_CODE_POINT) });
  }
  return ranges;
}

/** @param {number} weight */
function subsetFiles(weight) {
  return SUBSETS.map((subset) => join(fontFilesDir, `noto-sans-${subset}-${weight}-normal.woff`));
}

/** @param {string} fontstack @param {{ start: number, end: number }} range */
function outputPath(fontstack, range) {
  return join(outDir, fontstack, `${range.start}-${range.end}.pbf`);
}

/** True when every output exists and is newer than every input. */
async function isUpToDate() {
  const inputs = [scriptPath, ...FONTSTACKS.flatMap((stack) => subsetFiles(stack.weight))];
  const newestInputMs = Math.max(...(await Promise.all(inputs.map(async (f) => (await stat(f)).mtimeMs))));
  const outputs = FONTSTACKS.flatMap((stack) => allRanges().map((range) => outputPath(stack.name, range)));
  try {
    const outputTimes = await Promise.all(outputs.map(async (f) => (await stat(f)).mtimeMs));
    return Math.min(...outputTimes) >= newestInputMs;
  } catch {
    return false;
  }
}

// --- Protocol buffers, just enough for glyphs.proto (fontnik/proto/glyphs.proto) ------------
// glyphs { repeated fontstack stacks = 1; }
// fontstack { string name = 1; string range = 2; repeated glyph glyphs = 3; }
// glyph { uint32 id = 1; bytes bitmap = 2; … }

/** @param {Uint8Array} buf @param {number} pos @returns {[number, number]} value and next position */
function readVarint(buf, pos) {
  let value = 0;
  let shift = 0;
  for (;;) {
    if (pos >= buf.length) throw new Error('Truncated varint in glyph PBF');
    const byte = buf[pos++];
    value += (byte & 0x7f) * 2 ** shift;
    if (byte < 0x80) return [value, pos];
    shift += 7;
  }
}

/**
 * Calls `onField(fieldNumber, wireType, value, bytes)` for each field of a message; `bytes` is
 * the payload of a length-delimited field.
 * @param {Uint8Array} buf
 * @param {(field: number, wireType: number, value: number, bytes: Uint8Array | null) => void} onField
 */
function readFields(buf, onField) {
  let pos = 0;
  while (pos < buf.length) {
    const [key, afterKey] = readVarint(buf, pos);
    const field = Math.floor(key / 8);
    const wireType = key & 7;
    pos = afterKey;
    if (wireType === 0) {
      const [value, next] = readVarint(buf, pos);
      onField(field, wireType, value, null);
      pos = next;
    } else if (wireType === 2) {
      const [length, start] = readVarint(buf, pos);
      onField(field, wireType, length, buf.subarray(start, start + length));
      pos = start + length;
    } else if (wireType === 1 || wireType === 5) {
      pos += wireType === 1 ? 8 : 4;
    } else {
      throw new Error(`Unexpected protobuf wire type ${wireType} in glyph PBF`);
    }
  }
}

/** @param {number} value */
function encodeVarint(value) {
  const bytes = [];
  while (value >= 0x80) {
    bytes.push((value % 0x80) | 0x80);
    value = Math.floor(value / 0x80);
  }
  bytes.push(value);
  return Uint8Array.from(bytes);
}

/** @param {number} field @param {Uint8Array} payload */
function encodeBytesField(field, payload) {
  return Buffer.concat([encodeVarint(field * 8 + 2), encodeVarint(payload.length), payload]);
}

/**
 * The glyph messages of a fontnik range PBF, keyed by code point, each kept as its raw bytes.
 * @param {Uint8Array} pbf
 * @returns {Map<number, Uint8Array>}
 */
function decodeGlyphs(pbf) {
  /** @type {Map<number, Uint8Array>} */
  const glyphs = new Map();
  readFields(pbf, (field, _wireType, _value, stackBytes) => {
    if (field !== 1 || !stackBytes) return;
    readFields(stackBytes, (stackField, _w, _v, glyphBytes) => {
      if (stackField !== 3 || !glyphBytes) return;
      let id = -1;
      readFields(glyphBytes, (glyphField, _gw, value) => {
        if (glyphField === 1) id = value;
      });
      if (id < 0) throw new Error('Glyph without an id in fontnik output');
      glyphs.set(id, glyphBytes);
    });
  });
  return glyphs;
}

/**
 * One `glyphs` message with one fontstack holding the given glyphs in code-point order.
 * @param {string} name @param {{ start: number, end: number }} range @param {Map<number, Uint8Array>} glyphs
 */
function encodeFontstack(name, range, glyphs) {
  const parts = [
    encodeBytesField(1, Buffer.from(name, 'utf8')),
    encodeBytesField(2, Buffer.from(`${range.start}-${range.end}`, 'utf8')),
    ...[...glyphs.keys()].sort((a, b) => a - b).map((id) => encodeBytesField(3, /** @type {Uint8Array} */ (glyphs.get(id)))),
  ];
  return encodeBytesField(1, Buffer.concat(parts));
}

// --- fontnik ---------------------------------------------------------------------------------

/** @param {Buffer} font @returns {Promise<Set<number>>} the code points the font covers */
function loadCodePoints(font) {
  return new Promise((resolvePoints, reject) => {
    fontnik.load(font, (/** @type {Error | null} */ err, /** @type {{ points: number[] }[]} */ faces) => {
      if (err) reject(err);
      else resolvePoints(new Set(faces.flatMap((face) => face.points)));
    });
  });
}

/** @param {Buffer} font @param {{ start: number, end: number }} range @returns {Promise<Uint8Array>} */
function renderRange(font, range) {
  return new Promise((resolvePbf, reject) => {
    fontnik.range({ font, start: range.start, end: range.end }, (/** @type {Error | null} */ err, /** @type {Uint8Array} */ data) => {
      if (err) reject(err);
      else resolvePbf(data);
    });
  });
}

/**
 * Runs `task` over `items` with at most `limit` at a time (fontnik renders on libuv's pool).
 * @template T @param {T[]} items @param {number} limit @param {(item: T) => Promise<void>} task
 */
async function runPool(items, limit, task) {
  let next = 0;
  const workers = Array.from({ length: Math.min(limit, items.length) }, async () => {
    while (next < items.length) await task(items[next++]);
  });
  await Promise.all(workers);
}

/** @param {string} path @param {Uint8Array} data — written beside and renamed, so readers never see half a file */
async function writeAtomically(path, data) {
  const temporary = `${path}.${process.pid}.tmp`;
  await writeFile(temporary, data);
  await rename(temporary, path);
}

/** @param {{ name: string, weight: number }} fontstack */
async function buildFontstack(fontstack) {
  const subsets = await Promise.all(
    subsetFiles(fontstack.weight).map(async (file) => {
      const font = await readFile(file);
      return { font, codePoints: await loadCodePoints(font) };
    }),
  );
  await mkdir(join(outDir, fontstack.name), { recursive: true });

  let glyphCount = 0;
  await runPool(allRanges(), Math.max(1, Math.min(2, availableParallelism())), async (range) => {
    const covering = subsets.filter(({ codePoints }) => {
      for (let cp = range.start; cp <= range.end; cp++) if (codePoints.has(cp)) return true;
      return false;
    });
    /** @type {Map<number, Uint8Array>} */
    const merged = new Map();
    for (const { font } of covering) {
      for (const [id, glyph] of decodeGlyphs(await renderRange(font, range))) {
        if (!merged.has(id)) merged.set(id, glyph);
      }
    }
    glyphCount += merged.size;
    await writeAtomically(outputPath(fontstack.name, range), encodeFontstack(fontstack.name, range, merged));
  });
  return glyphCount;
}

async function main() {
  const started = performance.now();
  if (!args.force && (await isUpToDate())) {
    console.log(`build-glyphs: ${outDir} is up to date`);
    return;
  }
  for (const fontstack of FONTSTACKS) {
    const glyphCount = await buildFontstack(fontstack);
    console.log(`build-glyphs: ${fontstack.name}: ${glyphCount} glyphs in ${allRanges().length} ranges`);
  }
  console.log(`build-glyphs: wrote ${outDir} in ${((performance.now() - started) / 1000).toFixed(1)} s`);
}

main().catch((error) => {
  console.error('build-glyphs failed:', error);
  process.exitCode = 1;
});
