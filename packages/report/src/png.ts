/**
 * A minimal PNG encoder (8-bit RGBA, no interlace, filter type 0 on every row), enough for the
 * raster of a space-time map. Format: PNG specification (W3C Recommendation, 2nd ed., 2003),
 * sections 5 (datastream), 11.2 (IHDR, IDAT, IEND) and annex D (CRC-32); zlib does the deflate.
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

/**
 * CRC-32 as PNG uses it (PNG spec annex D).
 * @example crc32(new TextEncoder().encode('IEND')) // 0xae426082
 */
export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (let i = 0; i < bytes.length; i++) c = CRC_TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 'latin1');
  out.set(data, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)), 8 + data.length);
  return out;
}

/**
 * Encodes RGBA pixels (row-major, 4 bytes a pixel, top row first) as PNG bytes.
 * @param width pixels, >= 1
 * @param height pixels, >= 1
 * @param rgba width * height * 4 bytes
 * @throws RangeError when the buffer size does not match width * height * 4
 * @example encodePng(1, 1, new Uint8Array([255, 0, 0, 255])).subarray(1, 4) // "PNG" in ASCII
 */
export function encodePng(width: number, height: number, rgba: Uint8Array | Uint8ClampedArray): Uint8Array {
  if (!(width >= 1 && height >= 1) || rgba.length !== width * height * 4) {
    throw new RangeError(`bug: PNG of ${width} x ${height} needs ${width * height * 4} bytes, got ${rgba.length}`);
  }
  const stride = width * 4;
  const raw = new Uint8Array((stride + 1) * height);
  for (let y = 0; y < height; y++) {
    raw[y * (stride + 1)] = 0;
    raw.set(rgba.subarray(y * stride, (y + 1) * stride), y * (stride + 1) + 1);
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  const sig = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return new Uint8Array(Buffer.concat([sig, chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', new Uint8Array(0))]));
}
