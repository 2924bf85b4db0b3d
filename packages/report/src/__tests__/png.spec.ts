import { describe, expect, it } from 'vitest';
import { crc32, encodePng } from '../index.ts';
import { decodePng } from './svgQuery.ts';

describe('crc32', () => {
  it('gives the CRC every PNG file ends with for the IEND chunk type', () => {
    // PNG spec (W3C 2003) annex D; an empty IEND chunk's CRC is AE 42 60 82 in every PNG (common practice).
    expect(crc32(new TextEncoder().encode('IEND'))).toBe(0xae426082);
  });
  it('gives the standard check value for "123456789"', () => {
    // CRC-32/ISO-HDLC check value 0xCBF43926 (Rocksoft model parameters, Williams 1993).
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });
});

describe('encodePng', () => {
  it('writes the PNG signature and pixels that decode back unchanged', () => {
    const w = 3;
    const h = 2;
    const px = Uint8Array.from({ length: w * h * 4 }, (_, i) => (i * 37) & 255);
    const png = encodePng(w, h, px);
    expect(Array.from(png.subarray(0, 8))).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const back = decodePng(png);
    expect([back.width, back.height]).toEqual([w, h]);
    expect(Array.from(back.rgba)).toEqual(Array.from(px));
  });
  it('rejects a buffer of the wrong size', () => {
    expect(() => encodePng(2, 2, new Uint8Array(3))).toThrow(/needs 16 bytes, got 3/);
  });
});
