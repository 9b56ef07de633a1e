/**
 * A tiny PNG encoder for the colour maps embedded in SVG figures (8-bit RGB, no interlace, filter 0 per row),
 * following the PNG specification (W3C Recommendation, Portable Network Graphics (PNG) Specification, 2nd ed.,
 * 2003): signature, IHDR, one zlib-compressed IDAT, IEND, each chunk with its CRC-32.
 */
import { deflateSync } from 'node:zlib';

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 (ISO 3309 polynomial) of the bytes. */
export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out.subarray(4, 8 + data.length)));
  return out;
}

/** Encode `rgb` (width × height × 3 bytes, rows top to bottom) as PNG bytes. */
export function encodePng(width: number, height: number, rgb: Uint8Array): Uint8Array {
  if (rgb.length !== width * height * 3) throw new RangeError('pixel data does not match the image size');
  const header = new Uint8Array(13);
  const hv = new DataView(header.buffer);
  hv.setUint32(0, width);
  hv.setUint32(4, height);
  header.set([8, 2, 0, 0, 0], 8); // bit depth 8, colour type 2 (RGB), deflate, filter 0, no interlace
  const raw = new Uint8Array(height * (1 + 3 * width));
  for (let y = 0; y < height; y++) raw.set(rgb.subarray(y * 3 * width, (y + 1) * 3 * width), y * (1 + 3 * width) + 1);
  const parts = [
    Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', new Uint8Array(deflateSync(raw))),
    chunk('IEND', new Uint8Array(0)),
  ];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

/** A `data:` URI of PNG bytes, for an SVG `<image href>`. */
export const pngDataUri = (png: Uint8Array): string => `data:image/png;base64,${Buffer.from(png).toString('base64')}`;
