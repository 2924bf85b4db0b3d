/** Test helpers: parse SVG text as XML (a strict parser, so malformed output fails) and query it. */
import { DOMParser, type Document as XDocument, type Element as XElement } from '@xmldom/xmldom';
import { inflateSync } from 'node:zlib';

/** Parses SVG text; throws on any XML error (xmldom reports them through onError). */
export function parseSvg(text: string): XDocument {
  const errors: string[] = [];
  const doc = new DOMParser({ onError: (level, msg) => { if (level !== 'warning') errors.push(msg); } }).parseFromString(text, 'image/svg+xml');
  if (errors.length > 0) throw new Error(`SVG does not parse: ${errors.join('; ')}`);
  return doc;
}

/** All elements (any depth) with a tag name. */
export function byTag(root: XDocument | XElement, tag: string): XElement[] {
  return Array.from(root.getElementsByTagName(tag) as unknown as ArrayLike<XElement>);
}

/** Elements carrying a class. */
export function byClass(root: XDocument | XElement, tag: string, cls: string): XElement[] {
  return byTag(root, tag).filter((e) => (e.getAttribute('class') ?? '').split(/\s+/).includes(cls));
}

/** Texts of the <text> elements inside groups whose aria-label is `label` ("x-axis tick label"). */
export function labelTexts(root: XDocument | XElement, label: string): string[] {
  return byTag(root, 'g').filter((g) => g.getAttribute('aria-label') === label).flatMap((g) => byTag(g, 'text').map((t) => t.textContent ?? ''));
}

/** The panels (Plot's own <svg> elements nested in the composed plot). */
export function panels(doc: XDocument): XElement[] {
  return byTag(doc, 'svg').filter((s) => (s.getAttribute('class') ?? '').startsWith('plot-'));
}

/** y of a tick label from its transform "translate(x,y)". */
export function tickY(root: XElement, label: string, text: string): number {
  const t = byTag(root, 'g').filter((g) => g.getAttribute('aria-label') === label).flatMap((g) => byTag(g, 'text')).find((e) => e.textContent === text);
  if (!t) throw new Error(`no tick "${text}" in ${label}`);
  return Number(/translate\(([-\d.e]+),([-\d.e]+)\)/.exec(t.getAttribute('transform') ?? '')![2]);
}

/** x of a tick label. */
export function tickX(root: XElement, label: string, text: string): number {
  const t = byTag(root, 'g').filter((g) => g.getAttribute('aria-label') === label).flatMap((g) => byTag(g, 'text')).find((e) => e.textContent === text);
  if (!t) throw new Error(`no tick "${text}" in ${label}`);
  return Number(/translate\(([-\d.e]+),([-\d.e]+)\)/.exec(t.getAttribute('transform') ?? '')![1]);
}

/** Points of an SVG path made of M/L commands (what Plot's linear line curve emits). */
export function pathPoints(d: string): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  const re = /[ML]\s*([-\d.e]+)[,\s]([-\d.e]+)/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(d)) !== null) out.push([Number(m[1]), Number(m[2])]);
  return out;
}

/** Decodes an 8-bit RGBA, non-interlaced PNG (filter types 0..4, PNG spec section 9). */
export function decodePng(bytes: Uint8Array): { width: number; height: number; rgba: Uint8Array } {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let off = 8;
  let width = 0;
  let height = 0;
  const idat: Uint8Array[] = [];
  while (off < bytes.length) {
    const len = dv.getUint32(off);
    const type = String.fromCharCode(...bytes.subarray(off + 4, off + 8));
    const data = bytes.subarray(off + 8, off + 8 + len);
    if (type === 'IHDR') {
      width = dv.getUint32(off + 8); height = dv.getUint32(off + 12);
      if (data[8] !== 8 || data[9] !== 6) throw new Error('test decoder reads 8-bit RGBA only');
    }
    if (type === 'IDAT') idat.push(data);
    off += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * 4;
  const rgba = new Uint8Array(stride * height);
  for (let y = 0; y < height; y++) {
    const ft = raw[y * (stride + 1)];
    for (let x = 0; x < stride; x++) {
      const v = raw[y * (stride + 1) + 1 + x];
      const a = x >= 4 ? rgba[y * stride + x - 4] : 0;
      const b = y > 0 ? rgba[(y - 1) * stride + x] : 0;
      const c = x >= 4 && y > 0 ? rgba[(y - 1) * stride + x - 4] : 0;
      const p = a + b - c;
      const pr = Math.abs(p - a) <= Math.abs(p - b) && Math.abs(p - a) <= Math.abs(p - c) ? a : Math.abs(p - b) <= Math.abs(p - c) ? b : c;
      rgba[y * stride + x] = (v + [0, a, b, (a + b) >> 1, pr][ft]) & 255;
    }
  }
  return { width, height, rgba };
}
