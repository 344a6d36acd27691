/**
 * The report layer: SPICE netlist, bill of materials, versioned JSON,
 * Markdown summary and SVG plots of a design. Presentation only.
 *
 * @module
 */
export { toSpiceNetlist, type SpiceNetlistOptions } from "./spice.ts";
export type { OpampPin, OpampSubcircuit, OpampSupply } from "../circuit/index.ts";
export { toBomCsv, bomLines, type BomLine } from "./bom.ts";
export { toJson, fromJson, DESIGN_FORMAT_VERSION, JSON_MAX_CHARS, JSON_MAX_DEPTH } from "./json.ts";
export { toMarkdown, DESIGN_CAUTIONS } from "./markdown.ts";
export { toSvgPlot, type SvgPlotOptions } from "./svg.ts";
export { svgFigure, plotFigure, type Figure, type SvgFigureOptions } from "./figure.ts";
export type { MediaBundle, Displayable } from "../display.ts";
export { sectionRows, toSectionsCsv, toCurveCsv, type SectionRow, type CurveCsvOptions } from "./exports.ts";
