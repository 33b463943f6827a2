/**
 * A tiny PNG decoder for the plot tests (W3C PNG specification, 2nd ed.: chunks in section 5, filters in
 * section 9, colour types in section 6): 8-bit greyscale, RGB, grey+alpha and RGBA, not interlaced,
 * which is what Chromium writes for screenshots. Inflates with node:zlib.
 */
import { inflateSync } from 'node:zlib';

export interface DecodedPng {
  readonly width: number;
  readonly height: number;
  /** 4 bytes per pixel, RGBA, row-major. */
  readonly rgba: Uint8Array;
}

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
/** Bytes per pixel of each 8-bit colour type (PNG section 6.1). */
const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 4: 2, 6: 4 };

export function decodePng(file: Uint8Array): DecodedPng {
  if (!SIGNATURE.every((b, i) => file[i] === b)) throw new Error('not a PNG file');
  const view = new DataView(file.buffer, file.byteOffset, file.byteLength);
  let width = 0;
  let height = 0;
  let colorType = -1;
  const idat: Uint8Array[] = [];
  for (let at = 8; at < file.length; ) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...file.subarray(at + 4, at + 8));
    const data = file.subarray(at + 8, at + 8 + length);
    if (type === 'IHDR') {
      width = view.getUint32(at + 8);
      height = view.getUint32(at + 12);
      const depth = data[8];
      colorType = data[9];
      if (depth !== 8 || !(colorType in CHANNELS) || data[12] !== 0) throw new Error(`unsupported PNG: depth ${depth}, colour type ${colorType}, interlace ${data[12]}`);
    } else if (type === 'IDAT') idat.push(data);
    else if (type === 'IEND') break;
    at += 12 + length;
  }
  const bpp = CHANNELS[colorType];
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * bpp;
  const pixels = new Uint8Array(stride * height);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)];
    const src = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    const row = pixels.subarray(y * stride, (y + 1) * stride);
    const prev = y > 0 ? pixels.subarray((y - 1) * stride, y * stride) : new Uint8Array(stride);
    for (let i = 0; i < stride; i++) {
      const a = i >= bpp ? row[i - bpp] : 0;
      const b = prev[i];
      const c = i >= bpp ? prev[i - bpp] : 0;
      let v: number;
      switch (filter) {
        case 0: v = src[i]; break;
        case 1: v = src[i] + a; break;
        case 2: v = src[i] + b; break;
        case 3: v = src[i] + ((a + b) >> 1); break;
        case 4: {
          const p = a + b - c; // Paeth predictor, PNG section 9.4
          const pa = Math.abs(p - a);
          const pb = Math.abs(p - b);
          const pc = Math.abs(p - c);
          v = src[i] + (pa <= pb && pa <= pc ? a : pb <= pc ? b : c);
          break;
        }
        default: throw new Error(`bad PNG filter ${filter} in row ${y}`);
      }
      row[i] = v & 0xff;
    }
  }
  const rgba = new Uint8Array(width * height * 4);
  for (let p = 0; p < width * height; p++) {
    const s = pixels.subarray(p * bpp, p * bpp + bpp);
    const [r, g, b, a] = bpp === 1 ? [s[0], s[0], s[0], 255] : bpp === 2 ? [s[0], s[0], s[0], s[1]] : bpp === 3 ? [s[0], s[1], s[2], 255] : [s[0], s[1], s[2], s[3]];
    rgba.set([r, g, b, a], p * 4);
  }
  return { width, height, rgba };
}

/** How many pixels are within `tolerance` (Euclidean, 0..255 per channel) of the colour #rrggbb. */
export function countColor(png: DecodedPng, color: string, tolerance: number): number {
  const r = parseInt(color.slice(1, 3), 16);
  const g = parseInt(color.slice(3, 5), 16);
  const b = parseInt(color.slice(5, 7), 16);
  let n = 0;
  for (let p = 0; p < png.rgba.length; p += 4) {
    const dr = png.rgba[p] - r;
    const dg = png.rgba[p + 1] - g;
    const db = png.rgba[p + 2] - b;
    if (dr * dr + dg * dg + db * db <= tolerance * tolerance) n++;
  }
  return n;
}
