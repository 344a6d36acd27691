/**
 * Text in SVG without a font at hand: escaping, short coordinates, and a
 * conservative width estimate from the character count and the font size.
 *
 * Method: each character is given the advance width of the wider of the
 * common sans-serif faces (DejaVu Sans, the fallback of most Linux systems
 * and wider than Arial, Helvetica or Liberation Sans), in em: narrow marks
 * (i, l, j, t, f, r, I, J, most punctuation, space) 0.42, digits and lower
 * case 0.64, upper case 0.79, M, W, m, w, @, % and the dash 1.0, anything
 * else 0.84: each the widest glyph of its class in DejaVu Sans, read from
 * its hmtx table by scripts/reference/font-advances.py and rounded up
 * (the classes are our own). A string is never narrower than this estimate
 * in that face,
 * so margins sized from it do not clip labels; the browser test
 * (test/browser/) measures the real boxes.
 *
 * @module
 */

/** Escape text for SVG/XML character data and attribute values. */
export const esc = (s: string): string => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/** A coordinate with one decimal (pixels: finer is invisible and bloats the text). */
export const px = (x: number): string => {
  const r = Math.round(x * 10) / 10;
  return (r === 0 ? 0 : r).toString();
};

const NARROW = new Set("iljtfrIJ.,:;'!|()[] /-\u00b7".split(""));
const WIDE = new Set("MWmw@%\u2014".split(""));

/** Advance of one character, em. */
function advance(c: string): number {
  if (NARROW.has(c)) return 0.42;
  if (WIDE.has(c)) return 1.0;
  if ((c >= "0" && c <= "9") || (c >= "a" && c <= "z")) return 0.64;
  if (c >= "A" && c <= "Z") return 0.79;
  return 0.84;
}

/**
 * Estimated width of a text run, pixels, never below the width of the wider
 * common sans-serif faces (see the module header).
 *
 * @param s - the text
 * @param fontSize - font size, pixels
 * @returns the width, pixels
 */
export function textWidth(s: string, fontSize: number): number {
  let w = 0;
  for (const c of s) w += advance(c);
  return w * fontSize;
}

/**
 * Break text into lines no wider than `width` (by {@link textWidth}), at spaces;
 * a word wider than the line stands on its own line.
 *
 * @param s - the text
 * @param fontSize - font size, pixels
 * @param width - the widest line, pixels
 * @returns the lines
 */
export function wrapText(s: string, fontSize: number, width: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of s.split(/\s+/).filter((x) => x !== "")) {
    const next = line === "" ? word : `${line} ${word}`;
    if (line !== "" && textWidth(next, fontSize) > width) {
      lines.push(line);
      line = word;
    } else line = next;
  }
  if (line !== "") lines.push(line);
  return lines.length === 0 ? [""] : lines;
}

/** FNV-1a hash of a string as 8 hex digits (G. Fowler, L. C. Noll, K.-P. Vo, 1991; public domain), for ids unique per drawing. */
export function hashText(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, "0");
}
