/**
 * SVG plots as values a notebook shows as pictures. `toSvgPlot` and the other
 * plot functions return SVG text, which a notebook would print as a quoted
 * string; wrapping it in a figure makes it display as an image (and as its
 * title in a terminal front end), while `String(figure)` and `figure.svg`
 * give the text back for saving.
 *
 * @module
 */
import { withDisplay, type Displayable } from "../display.ts";
import { requireOptions } from "../validate.ts";
import { InvalidArgumentError } from "../errors.ts";
import type { DesignResult } from "../design/index.ts";
import { toSvgPlot, type SvgPlotOptions } from "./svg.ts";

/** An SVG picture that a notebook displays as an image. */
export interface Figure extends Displayable {
  /** The SVG text. */
  readonly svg: string;
  /** A short description, shown by terminal front ends. */
  readonly title: string;
  /** The SVG text (so a figure can be written to a file as it is). */
  toString(): string;
}

/** Options of {@link svgFigure}. */
export interface SvgFigureOptions {
  /**
   * A short description, shown by terminal front ends.
   * @defaultValue `"SVG plot"`
   */
  readonly title?: string;
}

/**
 * Wrap SVG text as a figure that a notebook displays as an image.
 *
 * @param svg - SVG text (from {@link toSvgPlot} or any other plot function)
 * @param options - title
 * @returns the figure
 * @throws {@link InvalidArgumentError} when `svg` is not SVG text
 * @example
 * ```ts
 * const fig = svgFigure('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"></svg>', { title: "empty" });
 * fig[Symbol.for("Jupyter.display")]()["text/plain"]; //=> "empty"
 * ```
 */
export function svgFigure(svg: string, options: SvgFigureOptions = {}): Figure {
  const fn = "svgFigure";
  if (typeof svg !== "string" || !/^\s*(<\?xml[^>]*>\s*)?<svg[\s>]/.test(svg)) {
    throw new InvalidArgumentError({ fn, path: "svg", message: "expected SVG text starting with <svg (the output of toSvgPlot or another plot function)", received: typeof svg === "string" ? svg.slice(0, 40) : svg });
  }
  const o = requireOptions(fn, "options", options);
  const t = o["title"];
  if (t !== undefined && (typeof t !== "string" || t.length === 0 || t.length > 200)) {
    throw new InvalidArgumentError({ fn, path: "options.title", message: "expected a short text (1 to 200 characters)", received: t });
  }
  const title = t === undefined ? "SVG plot" : t;
  const figure = { svg, title, toString: () => svg };
  return Object.freeze(withDisplay(figure, () => ({ "image/svg+xml": svg, "text/plain": title })));
}

/**
 * Plot a design (as {@link toSvgPlot} does) as a figure that a notebook
 * displays as an image.
 *
 * @param result - a design
 * @param options - plot kind and size, as for {@link toSvgPlot}
 * @returns the figure
 * @throws {@link InvalidArgumentError} when `result` is not a design result or an option is out of range
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * plotFigure(designFilter(spec)).svg.startsWith("<svg"); //=> true
 * ```
 */
export function plotFigure(result: DesignResult, options: SvgPlotOptions = {}): Figure {
  const svg = toSvgPlot(result, options);
  const kind = options.kind ?? "magnitude";
  return svgFigure(svg, { title: `${kind} plot of the ${result.spec.response} design (${result.family}, order ${result.order})` });
}
