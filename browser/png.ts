/**
 * Just enough of a PNG reader for the browser tests: the image's size and
 * its pixels as 8-bit RGBA, from the chunks, zlib inflation (node:zlib) and
 * the five scanline filters (W3C, "Portable Network Graphics (PNG)
 * Specification", 2nd ed., 2003, sections 5, 9 and 11.2.2). Colour types 2
 * (RGB) and 6 (RGBA) at 8 bits, not interlaced: what Chromium writes.
 */
import { inflateSync } from "node:zlib";

/** A decoded image. */
export interface Image {
  /** Width, pixels. */
  readonly width: number;
  /** Height, pixels. */
  readonly height: number;
  /** RGBA, row by row. */
  readonly rgba: Uint8Array;
}

/** The Paeth predictor (PNG specification, section 9.4). */
function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a);
  const pb = Math.abs(p - b);
  const pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/**
 * Decode a PNG.
 *
 * @param png - the file's bytes
 * @returns the image
 */
export function decodePng(png: Uint8Array): Image {
  const view = new DataView(png.buffer, png.byteOffset, png.byteLength);
  if (view.getUint32(0) !== 0x89504e47) throw new Error("not a PNG");
  let at = 8;
  let width = 0;
  let height = 0;
  let colourType = 0;
  const data: Uint8Array[] = [];
  while (at < png.length) {
    const length = view.getUint32(at);
    const type = String.fromCharCode(...png.subarray(at + 4, at + 8));
    const body = png.subarray(at + 8, at + 8 + length);
    if (type === "IHDR") {
      width = view.getUint32(at + 8);
      height = view.getUint32(at + 12);
      const depth = body[8];
      colourType = body[9] as number;
      if (depth !== 8 || (colourType !== 2 && colourType !== 6) || body[12] !== 0) throw new Error(`unsupported PNG: depth ${depth}, colour type ${colourType}, interlace ${body[12]}`);
    } else if (type === "IDAT") data.push(body);
    else if (type === "IEND") break;
    at += 12 + length;
  }
  const raw = inflateSync(Buffer.concat(data));
  const bpp = colourType === 6 ? 4 : 3;
  const stride = width * bpp;
  const pixels = new Uint8Array(height * stride);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)] as number;
    const src = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    const row = pixels.subarray(y * stride, (y + 1) * stride);
    const up = y > 0 ? pixels.subarray((y - 1) * stride, y * stride) : new Uint8Array(stride);
    for (let i = 0; i < stride; i++) {
      const a = i >= bpp ? (row[i - bpp] as number) : 0;
      const b = up[i] as number;
      const c = i >= bpp ? (up[i - bpp] as number) : 0;
      const x = src[i] as number;
      row[i] = (filter === 0 ? x : filter === 1 ? x + a : filter === 2 ? x + b : filter === 3 ? x + ((a + b) >> 1) : x + paeth(a, b, c)) & 0xff;
    }
  }
  const rgba = new Uint8Array(width * height * 4);
  for (let p = 0; p < width * height; p++) {
    rgba[4 * p] = pixels[bpp * p] as number;
    rgba[4 * p + 1] = pixels[bpp * p + 1] as number;
    rgba[4 * p + 2] = pixels[bpp * p + 2] as number;
    rgba[4 * p + 3] = bpp === 4 ? (pixels[bpp * p + 3] as number) : 255;
  }
  return { width, height, rgba };
}

/**
 * How much of an image is drawn: its distinct colours, and the share of
 * pixels that are not its most common colour (the background).
 *
 * @param img - a decoded image
 * @returns the counts
 */
export function inkStats(img: Image): { colours: number; inkFraction: number } {
  const counts = new Map<number, number>();
  for (let p = 0; p < img.width * img.height; p++) {
    const key = ((img.rgba[4 * p] as number) << 16) | ((img.rgba[4 * p + 1] as number) << 8) | (img.rgba[4 * p + 2] as number);
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return { colours: counts.size, inkFraction: 1 - Math.max(...counts.values()) / (img.width * img.height) };
}
