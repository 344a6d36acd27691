/**
 * Just enough PNG decoding to tell a blank screenshot from a drawn one:
 * 8-bit RGB or RGBA, non-interlaced (what Chromium writes), inflated with
 * node:zlib and unfiltered per scanline.
 *
 * Reference: W3C, "Portable Network Graphics (PNG) Specification (Second
 * Edition)", 2003, sections 7.3 and 9 (filter types 0-4, the Paeth predictor).
 */
import { inflateSync } from "node:zlib";

/** Decoded pixels. */
export interface Pixels {
  readonly width: number;
  readonly height: number;
  /** Bytes per pixel (3 or 4). */
  readonly channels: number;
  readonly data: Uint8Array;
}

/** Decode an 8-bit RGB/RGBA PNG. */
export function decodePng(png: Buffer): Pixels {
  let p = 8;
  let width = 0;
  let height = 0;
  let channels = 0;
  const idat: Buffer[] = [];
  while (p < png.length) {
    const len = png.readUInt32BE(p);
    const type = png.toString("ascii", p + 4, p + 8);
    const body = png.subarray(p + 8, p + 8 + len);
    if (type === "IHDR") {
      width = body.readUInt32BE(0);
      height = body.readUInt32BE(4);
      if (body[8] !== 8 || body[12] !== 0) throw new Error("only 8-bit non-interlaced PNGs are decoded");
      channels = body[9] === 6 ? 4 : body[9] === 2 ? 3 : 0;
      if (channels === 0) throw new Error(`PNG colour type ${body[9]} is not decoded`);
    } else if (type === "IDAT") idat.push(body);
    else if (type === "IEND") break;
    p += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const data = new Uint8Array(height * stride);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)] as number;
    const src = y * (stride + 1) + 1;
    for (let x = 0; x < stride; x++) {
      const a = x >= channels ? (data[y * stride + x - channels] as number) : 0;
      const b = y > 0 ? (data[(y - 1) * stride + x] as number) : 0;
      const c = x >= channels && y > 0 ? (data[(y - 1) * stride + x - channels] as number) : 0;
      const v = raw[src + x] as number;
      let pred = 0;
      if (filter === 1) pred = a;
      else if (filter === 2) pred = b;
      else if (filter === 3) pred = (a + b) >> 1;
      else if (filter === 4) {
        const pa = Math.abs(b - c);
        const pb = Math.abs(a - c);
        const pc = Math.abs(a + b - 2 * c);
        pred = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      data[y * stride + x] = (v + pred) & 255;
    }
  }
  return { width, height, channels, data };
}

/** Distinct colours and the share of pixels that are not the most common colour (the background). */
export function inkStats(px: Pixels): { colours: number; inkFraction: number } {
  const counts = new Map<number, number>();
  for (let i = 0; i < px.data.length; i += px.channels) {
    const key = ((px.data[i] as number) << 16) | ((px.data[i + 1] as number) << 8) | (px.data[i + 2] as number);
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const total = px.width * px.height;
  const background = Math.max(...counts.values());
  return { colours: counts.size, inkFraction: 1 - background / total };
}
