/**
 * Where the text of an SVG plot lies, from the SVG text alone: each `text`
 * element's box from its position, anchor, font size and the conservative
 * width estimate, ascent 0.93 em and descent 0.24 em (DejaVu Sans), turned by
 * a `rotate(-90 cx cy)` transform where it has one.
 */
import { textWidth } from "../../src/report/plot/text.ts";

/** A box, pixels. */
export interface Box {
  readonly text: string;
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
}

const unescape = (s: string): string => s.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&amp;/g, "&");

/** The viewBox of an SVG. */
export function viewBox(svg: string): { width: number; height: number } {
  const m = /viewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(svg);
  if (m === null) throw new Error("no viewBox");
  return { width: Number(m[1]), height: Number(m[2]) };
}

/** The estimated boxes of every text element. */
export function textBoxes(svg: string): Box[] {
  const base = Number(/<svg[^>]*font-size="([\d.]+)"/.exec(svg)?.[1] ?? "12");
  const out: Box[] = [];
  // a translate(dx dy) group moves the text after its start tag (the schematics use one)
  const group = /<g transform="translate\(([-\d.]+) ([-\d.]+)\)">/.exec(svg);
  for (const m of svg.matchAll(/<text([^>]*)>([^<]*)<\/text>/g)) {
    const moved = group !== null && (m.index as number) > group.index;
    const gx = moved ? Number(group[1]) : 0;
    const gy = moved ? Number(group[2]) : 0;
    const attrs = m[1] as string;
    const text = unescape(m[2] as string);
    const num = (name: string): number | undefined => {
      const a = new RegExp(`\\s${name}="([-\\d.]+)"`).exec(attrs);
      return a === null ? undefined : Number(a[1]);
    };
    const x = num("x") ?? 0;
    const y = num("y") ?? 0;
    const fs = num("font-size") ?? base;
    const anchor = /text-anchor="(\w+)"/.exec(attrs)?.[1] ?? "start";
    const w = textWidth(text, fs);
    const a = anchor === "middle" ? 0.5 : anchor === "end" ? 1 : 0;
    let box = { x0: x - a * w, x1: x + (1 - a) * w, y0: y - 0.93 * fs, y1: y + 0.24 * fs };
    const rot = /rotate\(-90 ([-\d.]+) ([-\d.]+)\)/.exec(attrs);
    if (rot !== null) {
      const cx = Number(rot[1]);
      const cy = Number(rot[2]);
      // (px, py) -> (cx + (py - cy), cy - (px - cx))
      const xs = [box.y0, box.y1].map((py) => cx + (py - cy));
      const ys = [box.x0, box.x1].map((px) => cy - (px - cx));
      box = { x0: Math.min(...xs), x1: Math.max(...xs), y0: Math.min(...ys), y1: Math.max(...ys) };
    }
    out.push({ text, x0: box.x0 + gx, x1: box.x1 + gx, y0: box.y0 + gy, y1: box.y1 + gy });
  }
  return out;
}
