/**
 * The schematics section of the Markdown report: each stage's schematic
 * written into the report as SVG (for renderers that show HTML: VS Code,
 * Jupyter, typedoc), or linked as an image file per stage whose name the
 * caller chooses (the files written with `toSvgSchematic`).
 *
 * @module
 */
import type { DesignResult } from "../design/index.ts";
import { InvalidArgumentError } from "../errors.ts";
import { toSvgSchematic } from "./schematic.ts";

/** How the report shows the stages' schematics: left out, written in, or linked as `{stage}`-numbered files. */
export type MarkdownSchematics = "none" | "inline" | string;

/**
 * Check the report's `schematics` option.
 *
 * @param fn - the public function, for the error
 * @param value - the option as given
 * @returns the option
 * @throws {@link InvalidArgumentError} when it is not `"none"`, `"inline"` or a file name containing `{stage}`
 */
export function requireSchematics(fn: string, value: unknown): MarkdownSchematics {
  if (value === undefined) return "none";
  if (value === "none" || value === "inline" || (typeof value === "string" && value.includes("{stage}") && value.length <= 300 && !/[\s()<>]/.test(value))) return value;
  throw new InvalidArgumentError({ fn, path: "options.schematics", received: value, message: 'expected "none", "inline" or a file name containing {stage} and no spaces or brackets, such as "stage-{stage}.svg"' });
}

/**
 * The section's lines.
 *
 * @param result - a design (checked by the caller)
 * @param mode - the option
 * @returns the lines, ending with an empty one (none for `"none"`)
 */
export function schematicLines(result: DesignResult, mode: MarkdownSchematics): string[] {
  if (mode === "none") return [];
  const L: string[] = ["## Schematics", ""];
  for (const st of result.stages) {
    const caption = `Stage ${st.index}: ${st.topologyName}`;
    if (mode === "inline") L.push(`${caption}`, "", toSvgSchematic(result, { stage: st.index }).trimEnd(), "");
    else L.push(`![${caption}](${mode.replace(/\{stage\}/g, String(st.index))})`, "");
  }
  return L;
}
