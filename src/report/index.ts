/**
 * The report layer: SPICE netlist, bill of materials, versioned JSON,
 * Markdown summary, SVG plots and schematics of a design, and the axis
 * ticks the plots use. Presentation only.
 *
 * @module
 */
export { toSpiceNetlist, type SpiceNetlistOptions } from "./spice.ts";
export type { OpampPin, OpampSubcircuit, OpampSupply } from "../circuit/index.ts";
export { toBomCsv, toLcLadderBomCsv, bomLines, type BomLine, type BomOptions } from "./bom.ts";
export { lcLadderMarkdown, LADDER_CAUTIONS } from "./lc-ladder-markdown.ts";
export { lcLadderFromJson, lcLadderToJson, LC_LADDER_FORMAT, LC_LADDER_FORMAT_VERSION } from "./lc-ladder-json.ts";
export type { RealisationChoice } from "./realisation.ts";
export { toJson, fromJson, DESIGN_FORMAT_VERSION, JSON_MAX_CHARS, JSON_MAX_DEPTH } from "./json.ts";
export { svgFigure, plotFigure, type Figure, type SvgFigureOptions } from "./figure.ts";
export type { MediaBundle, Displayable } from "../display.ts";
export { toMarkdown, DESIGN_CAUTIONS, type MarkdownOptions } from "./markdown.ts";
export type { MarkdownSchematics } from "./markdown-schematics.ts";
export { toSvgPlot, PLOT_KINDS, type PlotKind, type SvgPlotOptions } from "./svg.ts";
export { toSvgSchematic, type SvgSchematicOptions } from "./schematic.ts";
export { linearTicks, logTicks, type LinearTicks, type LinearTicksOptions, type LogTicks } from "./plot/ticks.ts";
export { sectionRows, toSectionsCsv, toSectionsJson, toCurveCsv, type SectionRow, type CurveCsvOptions } from "./exports.ts";
