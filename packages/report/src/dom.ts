/**
 * The headless document Observable Plot renders into: linkedom's DOM, plus a small canvas
 * stand-in. Plot draws raster marks and colour-ramp legends by filling a canvas and reading it
 * back with `toDataURL()`; a headless DOM has no canvas, so this one keeps the pixels in a byte
 * array and encodes them as PNG (see png.ts). It supports exactly what Plot 0.6 calls:
 * `getContext('2d')`, `createImageData`, `putImageData`, `fillStyle` + `fillRect`, `toDataURL`.
 */
import { parseHTML } from 'linkedom';
import { encodePng } from './png.ts';

interface ImageDataLike { width: number; height: number; data: Uint8ClampedArray }

class PixelCanvas {
  width = 300;
  height = 150;
  private pixels: Uint8ClampedArray | undefined;
  private buffer(): Uint8ClampedArray {
    if (!this.pixels || this.pixels.length !== this.width * this.height * 4) this.pixels = new Uint8ClampedArray(this.width * this.height * 4);
    return this.pixels;
  }
  getContext(kind: string): unknown {
    if (kind !== '2d') return null;
    const canvas = this;
    return {
      fillStyle: '#000',
      createImageData(w: number, h: number): ImageDataLike {
        return { width: w, height: h, data: new Uint8ClampedArray(w * h * 4) };
      },
      putImageData(img: ImageDataLike, dx: number, dy: number): void {
        const px = canvas.buffer();
        for (let y = 0; y < img.height; y++) {
          const ty = y + dy;
          if (ty < 0 || ty >= canvas.height) continue;
          for (let x = 0; x < img.width; x++) {
            const tx = x + dx;
            if (tx < 0 || tx >= canvas.width) continue;
            for (let k = 0; k < 4; k++) px[(ty * canvas.width + tx) * 4 + k] = img.data[(y * img.width + x) * 4 + k];
          }
        }
      },
      fillRect(this: { fillStyle: string }, x: number, y: number, w: number, h: number): void {
        const [r, g, b, a] = parseColour(this.fillStyle);
        const px = canvas.buffer();
        for (let yy = Math.max(0, Math.floor(y)); yy < Math.min(canvas.height, Math.ceil(y + h)); yy++) {
          for (let xx = Math.max(0, Math.floor(x)); xx < Math.min(canvas.width, Math.ceil(x + w)); xx++) {
            const j = (yy * canvas.width + xx) * 4;
            px[j] = r; px[j + 1] = g; px[j + 2] = b; px[j + 3] = a;
          }
        }
      },
    };
  }
  toDataURL(): string {
    const png = encodePng(this.width, this.height, this.buffer());
    return `data:image/png;base64,${Buffer.from(png).toString('base64')}`;
  }
}

/** Parses `rgb(r, g, b)`, `rgba(r, g, b, a)`, `#rgb` and `#rrggbb` (what d3 interpolators and our maps emit). */
export function parseColour(text: string): [number, number, number, number] {
  const s = text.trim();
  let m = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)(?:[\s,/]+([\d.]+))?\s*\)$/.exec(s);
  if (m) return [Number(m[1]), Number(m[2]), Number(m[3]), m[4] === undefined ? 255 : Math.round(Number(m[4]) * 255)];
  m = /^#([0-9a-f]{6})$/i.exec(s);
  if (m) { const v = parseInt(m[1], 16); return [v >> 16, (v >> 8) & 255, v & 255, 255]; }
  m = /^#([0-9a-f]{3})$/i.exec(s);
  if (m) { const v = m[1]; return [parseInt(v[0] + v[0], 16), parseInt(v[1] + v[1], 16), parseInt(v[2] + v[2], 16), 255]; }
  return [0, 0, 0, 0];
}

/** A fresh headless document for one plot (Plot's `document` option). */
export function createPlotDocument(): Document {
  const { document } = parseHTML('<!DOCTYPE html><html><head></head><body></body></html>');
  const create = document.createElement.bind(document);
  (document as unknown as { createElement: (name: string) => unknown }).createElement = (name: string) =>
    name.toLowerCase() === 'canvas' ? new PixelCanvas() : create(name);
  return document as unknown as Document;
}
