/**
 * The package root is the design API (design, spec, results, reports,
 * analyses, errors, value notation); everything else is reached through the
 * subpath exports. This pins the root's runtime names so that a layer's
 * internals (tuning constants, numerical helpers) cannot leak into it again.
 */
import { describe, expect, it } from "vitest";
import * as root from "../src/index.ts";
import * as design from "../src/design/index.ts";
import * as analysis from "../src/analysis/index.ts";
import * as report from "../src/report/index.ts";
import * as units from "../src/units/index.ts";

const ROOT_NAMES = [
  "CancelledError",
  "ConvergenceError",
  "FilterwrightError",
  "InvalidArgumentError",
  "ParseError",
  "SingularCircuitError",
  "SpecError",
  "UnrealisableError",
  "bomLines",
  "checkSpec",
  "compareRealisations",
  "designFilter",
  "designLcLadder",
  "designPolesZeros",
  "formatValue",
  "lcLadderNetlist",
  "fromJson",
  "monteCarlo",
  "monteCarloEnvelope",
  "noiseAnalysis",
  "opampRequirements",
  "parseValue",
  "partSensitivities",
  "plotFigure",
  "sectionRows",
  "toBomCsv",
  "toCurveCsv",
  "toJson",
  "toLcLadderBomCsv",
  "lcLadderMarkdown",
  "lcLadderToJson",
  "lcLadderFromJson",
  "toMarkdown",
  "toSectionsCsv",
  "toSectionsJson",
  "toSpiceNetlist",
  "svgFigure",
  "toSvgPlot",
  "toSvgSchematic",
  "validateSpec",
];

describe("package root (src/index.ts)", () => {
  it("exports exactly the design, report, analysis, error and notation API", () => {
    expect(Object.keys(root).sort()).toEqual([...ROOT_NAMES].sort());
  });

  it("exports no tuning constant or numerical helper", () => {
    const names = Object.keys(root);
    for (const internal of ["GBW_DEMAND_A0", "DEFAULT_LEVEL_OHMS", "BESSEL_MAX_ORDER", "TWO_PI", "cadd", "polyRoots", "topologies"]) {
      expect(names).not.toContain(internal);
    }
    expect(names.filter((n) => /^[A-Z][A-Z0-9_]+$/.test(n))).toEqual([]);
  });

  it("re-exports the same objects as the subpath exports", () => {
    const layers: Record<string, unknown>[] = [design, analysis, report, units];
    for (const [name, value] of Object.entries(root)) {
      if (name.endsWith("Error")) continue; // errors.ts has no subpath of its own
      expect(layers.some((m) => m[name] === value), name).toBe(true);
    }
  });
});
