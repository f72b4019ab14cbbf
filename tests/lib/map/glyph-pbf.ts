/**
 * A minimal reader for MapLibre glyph PBFs (glyphs.proto from mapbox/node-fontnik:
 * glyphs { repeated fontstack stacks = 1 }, fontstack { name = 1; range = 2; repeated glyph = 3 },
 * glyph { id = 1; bitmap = 2; width = 3; height = 4; left = 5 (sint32); top = 6 (sint32); advance = 7 }),
 * written from the protobuf encoding guide so the test does not trust the code that wrote the files.
 */
export type DecodedGlyph = {
  id: number;
  bitmapBytes: number;
  width: number;
  height: number;
  left: number;
  top: number;
  advance: number;
};

export type DecodedFontstack = { name: string; range: string; glyphs: DecodedGlyph[] };

type Field = { field: number; varint: number; bytes: Uint8Array | null };

function readVarint(buf: Uint8Array, pos: number): [number, number] {
  let value = 0;
  for (let shift = 0; ; shift += 7) {
    const byte = buf[pos];
    if (byte === undefined) throw new Error('truncated varint');
    pos += 1;
    value += (byte & 0x7f) * 2 ** shift;
    if (byte < 0x80) return [value, pos];
  }
}

function* fields(buf: Uint8Array): Generator<Field> {
  let pos = 0;
  while (pos < buf.length) {
    const [key, afterKey] = readVarint(buf, pos);
    const wireType = key & 7;
    const field = Math.floor(key / 8);
    if (wireType === 0) {
      const [varint, next] = readVarint(buf, afterKey);
      pos = next;
      yield { field, varint, bytes: null };
    } else if (wireType === 2) {
      const [length, start] = readVarint(buf, afterKey);
      if (start + length > buf.length) throw new Error('length-delimited field runs past the end');
      pos = start + length;
      yield { field, varint: length, bytes: buf.subarray(start, pos) };
    } else {
      throw new Error(`unexpected wire type ${wireType}`);
    }
  }
}

const zigzag = (n: number): number => (n % 2 === 0 ? n / 2 : -(n + 1) / 2);
const text = (bytes: Uint8Array | null): string => new TextDecoder().decode(bytes ?? new Uint8Array());

export function decodeGlyphPbf(buf: Uint8Array): DecodedFontstack[] {
  const stacks: DecodedFontstack[] = [];
  for (const top of fields(buf)) {
    if (top.field !== 1 || !top.bytes) continue;
    const stack: DecodedFontstack = { name: '', range: '', glyphs: [] };
    for (const f of fields(top.bytes)) {
      if (f.field === 1) stack.name = text(f.bytes);
      else if (f.field === 2) stack.range = text(f.bytes);
      else if (f.field === 3 && f.bytes) {
        const glyph: DecodedGlyph = { id: -1, bitmapBytes: 0, width: 0, height: 0, left: 0, top: 0, advance: 0 };
        for (const g of fields(f.bytes)) {
          if (g.field === 1) glyph.id = g.varint;
          else if (g.field === 2) glyph.bitmapBytes = g.bytes?.length ?? 0;
          else if (g.field === 3) glyph.width = g.varint;
          else if (g.field === 4) glyph.height = g.varint;
          else if (g.field === 5) glyph.left = zigzag(g.varint);
          else if (g.field === 6) glyph.top = zigzag(g.varint);
          else if (g.field === 7) glyph.advance = g.varint;
        }
        stack.glyphs.push(glyph);
      }
    }
    stacks.push(stack);
  }
  return stacks;
}
