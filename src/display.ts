/**
 * Rich display in notebooks. A Jupyter kernel for JavaScript (Deno's) shows a
 * value by calling its `Symbol.for("Jupyter.display")` method, which returns a
 * bundle of representations keyed by MIME type (`"text/html"`,
 * `"image/svg+xml"`, `"text/plain"`); the front end picks the richest it can
 * show, a terminal the plain text. Results carry the method as a
 * non-enumerable property, so it stays out of `Object.keys`, JSON, structured
 * clones and deep-equality checks.
 *
 * Reference: Jupyter messaging protocol, "display_data" and MIME bundles
 * (jupyter-client documentation); Deno's `Deno.jupyter.$display` symbol.
 *
 * @module
 */

/** The symbol a notebook kernel looks up to display a value (`Symbol.for("Jupyter.display")`). */
export const JUPYTER_DISPLAY: unique symbol = Symbol.for("Jupyter.display") as never;

/** Representations of one value, keyed by MIME type. */
export type MediaBundle = Readonly<Record<string, string>>;

/** A value a notebook shows richly. */
export interface Displayable {
  /** The representations of this value. */
  readonly [JUPYTER_DISPLAY]: () => MediaBundle;
}

/**
 * Give an object its notebook display (before it is frozen). The property is
 * non-enumerable and read-only; the bundle is built when the kernel asks.
 *
 * @param target - the object (not frozen yet)
 * @param render - builds the bundle
 * @returns the same object
 */
export function withDisplay<T extends object>(target: T, render: (value: T) => MediaBundle): T & Displayable {
  Object.defineProperty(target, JUPYTER_DISPLAY, {
    value: () => render(target),
    enumerable: false,
    writable: false,
    configurable: false,
  });
  return target as T & Displayable;
}

/** Text escaped for HTML element content and attribute values. */
export function escapeHtml(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/**
 * An HTML table of text cells (escaped), numeric-looking cells right-aligned.
 *
 * @param head - column headings
 * @param rows - rows of cells
 * @returns the table's HTML
 */
export function htmlTable(head: readonly string[], rows: readonly (readonly string[])[]): string {
  const numeric = /^[-+−]?[0-9.]/;
  const cell = (tag: "td" | "th", c: string): string =>
    `<${tag}${tag === "td" && numeric.test(c) ? ' style="text-align:right"' : ""}>${escapeHtml(c)}</${tag}>`;
  return [
    "<table>",
    `<thead><tr>${head.map((h) => cell("th", h)).join("")}</tr></thead>`,
    `<tbody>${rows.map((r) => `<tr>${r.map((c) => cell("td", c)).join("")}</tr>`).join("")}</tbody>`,
    "</table>",
  ].join("");
}

/**
 * Columns of text padded to a common width, as a terminal shows a table.
 *
 * @param head - column headings
 * @param rows - rows of cells
 * @returns the lines joined by newlines
 */
export function textTable(head: readonly string[], rows: readonly (readonly string[])[]): string {
  const all = [head, ...rows];
  const widths: number[] = [];
  for (const r of all) r.forEach((c, j) => (widths[j] = Math.max(widths[j] ?? 0, c.length)));
  return all.map((r) => r.map((c, j) => c.padEnd(widths[j] as number)).join("  ").trimEnd()).join("\n");
}
