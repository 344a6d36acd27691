/**
 * The `filterwright` command line, as a function of its arguments and an I/O
 * object so it can be tested without spawning processes. Presentation only:
 * every design decision lives in the design layer.
 *
 * Exit codes: 0 the design meets the spec (or the command succeeded), 1 the
 * design does not meet the spec, 2 the command could not be carried out (bad
 * input, a file that cannot be read or written, or an internal error), with
 * one line per problem on standard error and never a stack trace.
 *
 * @module
 */
import { ladderCommand } from "./ladder-command.ts";
import { writeOutputFiles } from "./outputs.ts";
import { FilterwrightError, SpecError } from "../errors.ts";
import { checkSpec, designFilter, type DesignResult, type FilterSpec, type Progress, type RunControl } from "../design/index.ts";
import { toBomCsv, toCurveCsv, toJson, toMarkdown, toSectionsCsv, toSectionsJson, toSpiceNetlist, toSvgPlot, PLOT_KINDS, type PlotKind } from "../report/index.ts";
import { topologies } from "../topologies/index.ts";
import { formatValue } from "../units/index.ts";
import { verdictLine } from "../design/verdict.ts";
import { compareRealisations, monteCarlo, noiseAnalysis, partSensitivities, type RealisationCandidate, type RealisationComparison } from "../analysis/index.ts";
import { readArgs, type GivenOption } from "./args.ts";
import { OPTIONS, OUTPUT_OPTIONS, type OptionDef } from "./options.ts";
import { CliProblem, CliProblems, ioReason } from "./problems.ts";
import { SCENARIOS } from "./scenarios.ts";
import { inFlagTerms, isPlainObject, issueLines, specFromOptions, type SpecSource } from "./spec-options.ts";
import { didYouMean } from "./suggest.ts";
import { boardsWork, formatSummary, realisedAs, table } from "./summary.ts";
import { quoted } from "./values.ts";

export { formatSummary } from "./summary.ts";

/** What the command line reads and writes. */
export interface CliIo {
  /** Write text to standard output. */
  readonly stdout: (text: string) => void;
  /** Write text to standard error. */
  readonly stderr: (text: string) => void;
  /** Read a text file (UTF-8). */
  readonly readFile: (path: string) => string;
  /** Read all of standard input (UTF-8), for `--spec -`. */
  readonly readStdin: () => string;
  /** Write a text file (UTF-8). */
  readonly writeFile: (path: string, text: string) => void;
  /**
   * Whether standard error is a terminal: a long run then shows one progress
   * line there, rewritten in place and cleared when the run ends.
   * @defaultValue false
   */
  readonly stderrIsTerminal?: boolean;
}

/** The program version printed by `--version`. */
export const CLI_VERSION = "0.1.0";

function helpLines(section: OptionDef["section"]): string[] {
  return OPTIONS.filter((o) => o.section === section).map((o) => {
    const left = `  --${o.name}${o.placeholder === "" ? "" : ` ${o.placeholder}`}`;
    return `${left.padEnd(24)} ${o.help}`;
  });
}

const USAGE = `filterwright — design an active analog filter from a spec, down to preferred-value parts

usage:
  filterwright design [spec options] [output options]
  filterwright design --spec file.json [spec options to override] [output options]
  filterwright demo [--scenario ${Object.keys(SCENARIOS).join("|")}] [spec options to override] [output options]
  filterwright ladder [mask options] [ladder: options] [--netlist FILE] [--bom FILE]   (a passive LC ladder)
  filterwright topologies
  filterwright --help | --version

spec options:
${helpLines("spec").join("\n")}

output options (FILE "-" writes to standard output; the summary then goes to standard error):
${helpLines("output").join("\n")}

${helpLines("general").join("\n")}

values: numbers are plain decimals (12, 0.5, 2.2e-9); frequencies, resistances, capacitances, volts,
noise densities and V/V gains also take engineering notation (20k, 4k7, 10 MHz, 100n); dB figures may
end in dB; tolerances and the yield target take 2% or 0.02. A flag without a value takes none.

exit codes: 0 the boards meet the spec (nominal margins, stability, and the yield target by the lower
            end of the 95 % interval), 1 they do not, 2 the command could not be carried out (bad input,
            a file that cannot be read or written), with one line per problem on standard error
`;

/** Where an analysis option's errors point, by the analysis function's option path. */
const ANALYSIS_FLAGS: Readonly<Record<string, string>> = {
  "options.runs": "yield",
  "options.seed": "seed",
  "options.opampVoltageNoise": "noise",
  "options.opampCurrentNoise": "noise-in",
};

/** Run an analysis, its argument errors told as the flag that gave the argument. */
function analysis<T>(options: ReadonlyMap<string, GivenOption>, f: () => T): T {
  try {
    return f();
  } catch (e) {
    const flag = e instanceof FilterwrightError ? ANALYSIS_FLAGS[e.path] : undefined;
    const given = flag === undefined ? undefined : options.get(flag);
    if (e instanceof FilterwrightError && given !== undefined) {
      throw new CliProblem(`--${flag} ${quoted(given.text)}: ${e.reason} (${given.def.what}, e.g. --${flag} ${given.def.example})`);
    }
    throw e;
  }
}

/** With --compare, the cascade against the active ladders on the same boards (--yield boards each, default 2000; --seed); with --realisation (or the spec's), the design's own comparison. */
function comparisonOf(r: DesignResult, o: ReadonlyMap<string, GivenOption>): RealisationComparison | undefined {
  if (r.realisation !== undefined) return r.realisation;
  if (o.get("compare")?.value !== true) return undefined;
  const runs = o.get("yield")?.value;
  const seed = o.get("seed")?.value;
  return analysis(o, () => compareRealisations(r, { runs: typeof runs === "number" ? runs : 2000, ...(typeof seed === "number" ? { seed } : {}) }));
}

/** The extra report lines asked for: Monte Carlo boards, output noise, part sensitivities. */
function extraLines(r: DesignResult, o: ReadonlyMap<string, GivenOption>, control: RunControl, c: RealisationComparison | undefined): string[] {
  const extra: string[] = [];
  const runs = o.get("yield")?.value;
  if (typeof runs === "number") {
    const seed = o.get("seed")?.value;
    // The boards spread their parts as the spec says (--distribution), as the design's own yield check does.
    const distribution = r.spec.partDistribution;
    const mc = analysis(o, () => monteCarlo(r, { runs, seed: typeof seed === "number" ? seed : 1, distribution, ...control }));
    extra.push(
      `Monte Carlo: ${mc.runs} boards, resistors +-${(mc.tolerances.resistor * 100).toFixed(1)} %, capacitors +-${(mc.tolerances.capacitor * 100).toFixed(1)} % (${distribution}): ` +
        `${(mc.yield * 100).toFixed(1)} % meet the mask (+-${(mc.yieldStandardError * 100).toFixed(1)} %); ` +
        `worst margin ${mc.marginDb.min.toFixed(3)} dB, median ${mc.marginDb.median.toFixed(3)} dB`,
    );
  }
  if (c !== undefined) {
    const pc = (x: number): string => `${(x * 100).toFixed(1)} %`;
    const rows = [["realisation", "op-amps", "R and C", "yield", "95 % interval", "median margin"]];
    for (const k of c.candidates) rows.push([k.method, String(k.opamps), String(k.parts), pc(k.yield), `${pc(k.lower95)} - ${pc(k.upper95)}`, `${k.medianMarginDb.toFixed(3)} dB`]);
    extra.push(
      `realisations on ${c.candidates[0]?.boards ?? 0} boards each at ${pc(c.tolerances.resistor)} R / ${pc(c.tolerances.capacitor)} C (seed ${c.seed}):\n${table(rows)}\n` +
        `${c.skipped.map((k) => `${k.method}: not built (${k.reason})\n`).join("")}choice: ${c.reason}` +
        (c.chosen === 0 ? "" : `\nthe netlist, BOM and report written are of the chosen realisation (${c.candidates[c.chosen]?.method})`),
    );
  }
  const en = o.get("noise")?.value;
  if (typeof en === "number") {
    const inoise = o.get("noise-in")?.value;
    const nz = analysis(o, () => noiseAnalysis(r, { opampVoltageNoise: en, ...(typeof inoise === "number" ? { opampCurrentNoise: inoise } : {}) }));
    const [lo, hi] = nz.bandHz;
    const top = nz.topContributors
      .slice(0, 5)
      .map((c) => `${c.name} ${(c.powerFraction * 100).toFixed(1)} %`)
      .join(", ");
    extra.push(
      `output noise ${formatValue(lo, { digits: 3, unit: "Hz" })} to ${formatValue(hi, { digits: 3, unit: "Hz" })}: ` +
        `${formatValue(nz.totalRmsV, { digits: 3, unit: "V" })} rms at the output; largest contributors: ${top}`,
    );
  }
  if (o.get("sensitivity")?.value === true) {
    const rows = [["stage", "part", "value", "S^f0", "S^Q", "S^fz", "S^gain"]];
    for (const x of partSensitivities(r)) {
      rows.push([
        String(x.stage),
        x.part,
        formatValue(x.value, { digits: 3, unit: x.part.startsWith("C") ? "F" : "Ω", space: false }),
        x.f0.toFixed(3),
        x.q.toFixed(3),
        x.fz.toFixed(3),
        x.gain.toFixed(3),
      ]);
    }
    extra.push("sensitivities (relative change of the figure per relative change of the part):", table(rows));
  }
  return extra;
}

/** Each output's text; with --compare, the netlist, BOM and report are of the chosen realisation. */
const RENDER: Readonly<Record<(typeof OUTPUT_OPTIONS)[number], (r: DesignResult, c: RealisationComparison | undefined) => string>> = {
  json: toJson,
  netlist: (r, c) => toSpiceNetlist(r, c === undefined ? {} : { realisation: c.candidates[c.chosen] as RealisationCandidate }),
  bom: (r, c) => toBomCsv(r, c === undefined ? {} : { realisation: c.candidates[c.chosen] as RealisationCandidate }),
  markdown: (r, c) => toMarkdown(r, c === undefined ? {} : { realisations: c }),
  svg: (r) => toSvgPlot(r),
  sections: toSectionsCsv, // a path ending in .json gets toSectionsJson (writeOutputs)
  curves: (r) => toCurveCsv(r),
};

/** The --plot kind, checked (undefined when not given). */
function plotKindOf(o: ReadonlyMap<string, GivenOption>): PlotKind | undefined {
  const given = o.get("plot")?.text;
  if (given === undefined) return undefined;
  if (!(PLOT_KINDS as readonly string[]).includes(given)) {
    throw new CliProblem(`--plot ${quoted(given)}: no such plot kind${didYouMean(given, PLOT_KINDS)} (kinds: ${PLOT_KINDS.join(", ")})`);
  }
  return given as PlotKind;
}

/** Write the files asked for; returns the text bound for standard output (at most one output asks for it). */
function writeOutputs(r: DesignResult, o: ReadonlyMap<string, GivenOption>, io: CliIo, c: RealisationComparison | undefined): string | undefined {
  const kind = plotKindOf(o);
  const render = (k: (typeof OUTPUT_OPTIONS)[number]): string => {
    const path = o.get(k)?.text ?? "";
    if (k === "sections" && /\.json$/i.test(path)) return toSectionsJson(r);
    return k === "svg" && kind !== undefined ? toSvgPlot(r, { kind }) : RENDER[k](r, c);
  };
  return writeOutputFiles(o, io, OUTPUT_OPTIONS.map((k) => [k, () => render(k)] as const));
}

/**
 * The progress reporter. With `--progress`, every step on its own line of
 * standard error (batches of boards at most once a second); otherwise, when
 * standard error is a terminal and `--quiet` is not given, one line rewritten
 * in place (at most ten times a second) that {@link endProgress} clears.
 */
function progressOf(o: ReadonlyMap<string, GivenOption>, io: CliIo): RunControl {
  if (o.get("progress")?.value !== true) {
    if (io.stderrIsTerminal !== true || o.get("quiet")?.value === true) return {};
    let last = -Infinity;
    return {
      onProgress: (p: Progress) => {
        if (p.elapsedMs - last < 100) return;
        last = p.elapsedMs;
        const boards = p.boards === undefined ? "" : ` ${p.boards}/${p.totalBoards}`;
        io.stderr(`\r\x1b[2K[${(p.elapsedMs / 1000).toFixed(1)} s] ${p.message}${boards}`.slice(0, 200));
      },
    };
  }
  let lastBoards = -Infinity;
  return {
    onProgress: (p: Progress) => {
      if (p.step === "boards") {
        if (p.elapsedMs - lastBoards < 1000) return;
        lastBoards = p.elapsedMs;
      }
      const boards = p.boards === undefined ? "" : ` ${p.boards}/${p.totalBoards}`;
      io.stderr(`[${(p.elapsedMs / 1000).toFixed(1)} s] ${p.message}${boards}\n`);
    },
  };
}

/** Clear the in-place progress line, if one was shown. */
function endProgress(o: ReadonlyMap<string, GivenOption>, io: CliIo): void {
  if (io.stderrIsTerminal === true && o.get("progress")?.value !== true && o.get("quiet")?.value !== true) io.stderr("\r\x1b[2K");
}

/** Design the spec, or say in command-line terms why it cannot be designed. */
function designOrExplain(spec: Record<string, unknown>, source: SpecSource, earlier: Earlier, control: RunControl = {}): DesignResult {
  // The spec's own issues are listed with the values that could not be read, those options' fields left out.
  const lines = [...earlier.lines, ...issueLines(checkSpec(spec), source, earlier.failed)];
  if (lines.length > 0) throw new CliProblems(lines);
  try {
    // the spec comes from JSON and flags: designFilter validates it at run time
    return designFilter(spec as unknown as FilterSpec, control);
  } catch (e) {
    if (e instanceof SpecError) throw new CliProblems(issueLines(e.issues, source));
    if (e instanceof FilterwrightError) {
      const lines = issueLines([{ path: e.path, message: e.reason }], source);
      const generic = lines.length === 1 && lines[0] === `${e.path}: ${inFlagTerms(e.reason)}`;
      throw new CliProblem(generic ? `cannot design this filter: ${inFlagTerms(e.reason)}` : lines.join("; "));
    }
    throw e;
  }
}

/** Problems found before the spec is checked: option values that could not be read. */
interface Earlier {
  readonly lines: readonly string[];
  readonly failed: ReadonlySet<string>;
}

/** What a design run starts from: the base spec, where it came from, and a heading for the summary. */
interface Start {
  readonly base: Record<string, unknown>;
  readonly sourceName: string | undefined;
  readonly heading: string;
}

function design(start: Start, o: ReadonlyMap<string, GivenOption>, earlier: Earlier, io: CliIo): number {
  const { base, sourceName } = start;
  const merged = specFromOptions(base, o);
  if (merged.problems.length > 0) throw new CliProblems([...earlier.lines, ...merged.problems]);
  if ((merged.spec as { realisation?: unknown }).realisation === "lc-ladder") {
    throw new CliProblem(`realisation "lc-ladder"${sourceName === undefined ? "" : ` in ${sourceName}`}: a passive LC ladder is designed by filterwright ladder (with --source-ohms, --load-ohms, --inductors, ...)`);
  }
  plotKindOf(o); // a misspelt --plot is refused before the design runs
  const control = progressOf(o, io);
  let r: DesignResult;
  let extra: string[];
  let comparison: RealisationComparison | undefined;
  try {
    r = designOrExplain(merged.spec, { name: sourceName, base, options: o }, earlier, control);
    comparison = comparisonOf(r, o);
    extra = extraLines(r, o, control, comparison);
  } finally {
    endProgress(o, io);
  }
  const toStdout = writeOutputs(r, o, io, comparison);
  // With an output on standard output, the summary goes to standard error so the output can be piped.
  const say = toStdout === undefined ? io.stdout : io.stderr;
  if (start.heading !== "") say(start.heading);
  if (o.get("quiet")?.value === true) {
    say(`${boardsWork(r) ? "meets" : "does not meet"} the spec: ${r.family} order ${r.order}, ${realisedAs(r)}${verdictLine(r)}\n${extra.map((x) => `${x}\n`).join("")}`);
  } else say(formatSummary(r, extra));
  if (toStdout !== undefined) io.stdout(toStdout);
  return boardsWork(r) ? 0 : 1;
}

/** The base spec: the --spec file's contents, or empty without one (its read problems told with the earlier ones). */
function specBase(file: string | undefined, earlier: Earlier, io: CliIo): Record<string, unknown> {
  if (file === undefined) return {};
  try {
    return readSpecFile(file, io);
  } catch (e) {
    throw e instanceof CliProblem ? new CliProblems([...earlier.lines, e.message]) : e;
  }
}

/** The spec file named by --spec, as an object. */
function readSpecFile(file: string, io: CliIo): Record<string, unknown> {
  // "-" reads the spec from standard input (`... | filterwright design --spec -`)
  const name = file === "-" ? "standard input" : file;
  let text: string;
  try {
    text = file === "-" ? io.readStdin() : io.readFile(file);
  } catch (e) {
    throw new CliProblem(`cannot read ${name} (--spec): ${ioReason(e, false)}`);
  }
  if (file === "-" && text.trim() === "") throw new CliProblem("standard input (--spec -) is empty; pipe a JSON spec into the command, or give the path of a JSON file");
  file = name;
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new CliProblem(`${file} (--spec) is not valid JSON: ${e instanceof Error ? e.message : String(e)}`);
  }
  if (!isPlainObject(parsed)) throw new CliProblem(`${file} (--spec) must hold a JSON object (the filter spec), not ${Array.isArray(parsed) ? "an array" : JSON.stringify(parsed)}`);
  return parsed;
}

function run(argv: readonly string[], io: CliIo): number {
  const args = readArgs(argv);
  if (args.help) {
    io.stdout(USAGE);
    return 0;
  }
  if (args.version && args.problems.length === 0) {
    io.stdout(`filterwright ${CLI_VERSION}\n`);
    return 0;
  }
  if (args.problems.length > 0) throw new CliProblems([...args.problems, ...args.valueProblems]);
  const o = args.options;
  const earlier: Earlier = { lines: args.valueProblems, failed: args.failed };
  if (args.valueProblems.length > 0 && (args.command === "topologies" || args.failed.has("spec") || args.failed.has("scenario"))) {
    throw new CliProblems(args.valueProblems);
  }
  switch (args.command) {
    case undefined:
      throw new CliProblem("no command given: use filterwright design, demo, ladder or topologies (filterwright --help lists the options)");
    case "topologies": {
      const rows = [["id", "name", "order", "kinds", "op-amps", "inverting"]];
      for (const t of topologies) rows.push([t.id, t.name, String(t.order), t.kinds.join(" "), String(t.opampCount), t.inverting ? "yes" : "no"]);
      io.stdout(`${table(rows)}\n`);
      return 0;
    }
    case "design": {
      const file = o.get("spec")?.text;
      return design({ base: specBase(file, earlier, io), sourceName: file, heading: "" }, o, earlier, io);
    }
    case "ladder": {
      const file = o.get("spec")?.text;
      return ladderCommand(specBase(file, earlier, io), file, o, earlier, io);
    }
    case "demo": {
      const key = o.get("scenario")?.text ?? "vibration";
      const sc = SCENARIOS[key];
      const names = Object.keys(SCENARIOS);
      if (sc === undefined) throw new CliProblem(`--scenario ${quoted(key)}: no such scenario${didYouMean(key, names)} (scenarios: ${names.join(", ")})`);
      const heading = o.get("quiet")?.value === true ? "" : `demo: ${sc.title}\n${sc.story}\n\n`;
      return design({ base: sc.spec as unknown as Record<string, unknown>, sourceName: `scenario ${key}`, heading }, o, earlier, io);
    }
  }
}

/** Print a failure as lines on standard error; the exit code is always 2. */
function reportFailure(e: unknown, io: CliIo): number {
  const lines =
    e instanceof CliProblems
      ? e.lines
      : e instanceof CliProblem
        ? [e.message]
        : e instanceof FilterwrightError
          ? [inFlagTerms(e.message.split("\n")[0] ?? e.message)]
          : [`internal error (a bug in filterwright; please report it with the command line): ${(e instanceof Error ? e.message : String(e)).split("\n")[0]}`];
  for (const line of lines) io.stderr(`filterwright: ${line}\n`);
  return 2;
}

/**
 * Run the command line.
 *
 * @param argv - arguments after the program name (e.g. `["design", "--spec", "a.json"]`)
 * @param io - output streams and file access
 * @returns the exit code: 0 the design meets the spec (or the command succeeded), 1 it does not, 2 the
 *   command could not be carried out (bad input, a file that cannot be read or written, an internal error)
 * @throws never (every failure becomes lines on standard error and exit code 2)
 * @example
 * ```ts
 * runCli(["design", "--response", "lowpass", "--pass", "1k", "--pass-loss", "1", "--stop", "4k", "--stop-atten", "40"], io);
 * //=> 0
 * ```
 */
export function runCli(argv: readonly string[], io: CliIo): number {
  try {
    return run(argv, io);
  } catch (e) {
    try {
      return reportFailure(e, io);
    } catch {
      return 2;
    }
  }
}

/** The spec type the command line builds (re-exported for scenario files). */
export type { FilterSpec };
