/**
 * The `filterwright` command line, as a function of its arguments and an I/O
 * object so it can be tested without spawning processes. Presentation only:
 * every design decision lives in the design layer.
 *
 * Exit codes: 0 the design meets the spec (or the command succeeded), 1 the
 * design does not meet the spec, 2 bad input (the problems are printed, no
 * stack trace), 3 an unexpected internal error.
 *
 * @module
 */
import { describeValue, FilterwrightError, SpecError } from "../errors.ts";
import { designFilter, type DesignResult, type FilterSpec } from "../design/index.ts";
import { DESIGN_CAUTIONS, toBomCsv, toJson, toMarkdown, toSpiceNetlist, toSvgPlot } from "../report/index.ts";
import { topologies } from "../topologies/index.ts";
import { formatValue, parseValue } from "../units/index.ts";
import { SCENARIOS } from "./scenarios.ts";
import { verdictLine } from "../report/verdict.ts";
import { monteCarlo, noiseAnalysis, partSensitivities } from "../analysis/index.ts";

/** What the command line reads and writes. */
export interface CliIo {
  /** Write text to standard output. */
  readonly stdout: (text: string) => void;
  /** Write text to standard error. */
  readonly stderr: (text: string) => void;
  /** Read a text file (UTF-8). */
  readonly readFile: (path: string) => string;
  /** Write a text file (UTF-8). */
  readonly writeFile: (path: string, text: string) => void;
}

/** The program version printed by `--version`. */
export const CLI_VERSION = "0.1.0";

const USAGE = `filterwright — design an active analog filter from a spec, down to preferred-value parts

usage:
  filterwright design [spec options] [output options]
  filterwright design --spec file.json [spec options to override] [output options]
  filterwright demo [--scenario ${Object.keys(SCENARIOS).join("|")}] [output options]
  filterwright topologies
  filterwright --help | --version

spec options:
  --response lowpass|highpass|bandpass|bandstop
  --pass F[,F2]          passband edge(s), e.g. 20k or 300,3.4k (Hz)
  --pass-loss DB         largest passband loss (dB)
  --pass-top F           highpass/bandstop: check the passband up to F (default 100 x edge)
  --stop F[,F2]          stopband edge(s) (Hz)
  --stop-atten DB        smallest stopband attenuation (dB)
  --gain DB              passband gain in dB (default 0)
  --gain-vv X            passband gain in V/V (negative: inverting)
  --polarity non-inverting|inverting|either
  --family NAME|auto     butterworth chebyshev1 chebyshev2 elliptic bessel legendre
  --priority P           fewest-op-amps (default) | fewest-stages | flattest-delay | monotonic
  --order N              fix the prototype order
  --topology ID|auto     one topology for every stage, or ID1,ID2,... per stage
  --caps SERIES          capacitor series (default E12)
  --res SERIES           resistor series (default E96)
  --r-min OHMS --r-max OHMS   resistor window (default 1k to 100k)
  --cap-tol T --res-tol T     fix the part tolerances, e.g. 2% or 0.02 (default: capacitors 5 %, resistors
                          the series' usual, and the design may tighten them per part for the yield target)
  --yield-target Y        fraction of boards that must meet the mask, e.g. 99% or 0.99 (default 95%)
  --input-peak V --swing V    signal levels: largest input (V peak) and op-amp output swing (V peak, default 10);
                          checks every op-amp output for clipping
  --distribution D        part spread within tolerance: uniform (default) | normal (tolerance = 3 sigma)
  --gbw HZ [--a0 GAIN]   real op-amp (single pole); default ideal

output options:
  --json FILE  --netlist FILE  --bom FILE  --markdown FILE  --svg FILE (magnitude and mask)
  --sensitivity           list each part's sensitivities (S^f0, S^Q, S^gain)
  --yield N [--seed S]    also build N boards with parts spread within their tolerance (Monte Carlo)
  --noise EN [--noise-in IN]  output noise: resistors plus op-amp voltage noise EN (V/rtHz, e.g. 8n; 0 for
                          resistors only) and current noise IN (A/rtHz, e.g. 1p); RMS over the response span
  --quiet                 print only the verification line

exit codes: 0 the boards meet the spec (nominal margins, stability, and the yield target by the lower
            end of the 95 % interval), 1 they do not, 2 bad input, 3 internal error
`;

class UsageError extends Error {}

const FLAGS = new Set(["quiet", "help", "version", "sensitivity"]);
const VALUE_OPTIONS = new Set([
  "response",
  "pass",
  "pass-loss",
  "pass-top",
  "stop",
  "stop-atten",
  "gain",
  "gain-vv",
  "polarity",
  "family",
  "priority",
  "order",
  "topology",
  "caps",
  "res",
  "r-min",
  "r-max",
  "cap-tol",
  "res-tol",
  "yield-target",
  "distribution",
  "input-peak",
  "swing",
  "gbw",
  "a0",
  "spec",
  "json",
  "netlist",
  "bom",
  "markdown",
  "svg",
  "yield",
  "noise",
  "noise-in",
  "seed",
  "scenario",
]);

function parseArgs(argv: readonly string[]): { positional: string[]; options: Map<string, string | true> } {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i] as string;
    if (a === "-h") {
      options.set("help", true);
      continue;
    }
    if (!a.startsWith("--")) {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf("=");
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    if (FLAGS.has(name)) {
      options.set(name, true);
      continue;
    }
    if (!VALUE_OPTIONS.has(name)) throw new UsageError(`unknown option --${name} (see filterwright --help)`);
    const value = eq >= 0 ? a.slice(eq + 1) : argv[++i];
    if (value === undefined) throw new UsageError(`option --${name} needs a value`);
    if (options.has(name)) throw new UsageError(`option --${name} given twice`);
    options.set(name, value);
  }
  return { positional, options };
}

/** A number when the text is one, else the text (so spec validation reports it with its path). */
function num(text: string): number | string {
  const t = text.trim();
  return t !== "" && Number.isFinite(Number(t)) ? Number(t) : text;
}

/** A tolerance written as `2%` or `0.02`; anything else is passed on for the spec check to reject. */
function fraction(text: string): number | string {
  const t = text.trim();
  if (t.endsWith("%")) {
    const v = num(t.slice(0, -1));
    return typeof v === "number" ? v / 100 : text;
  }
  return num(t);
}

function edge(text: string): string | number | [string | number, string | number] {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.length === 2) return [num(parts[0] as string), num(parts[1] as string)];
  return num(text);
}

function isObj(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** Merge command-line spec options over a base spec (from a file, a scenario, or nothing). */
function specFromOptions(base: Record<string, unknown>, o: Map<string, string | true>): Record<string, unknown> {
  const spec: Record<string, unknown> = { ...base };
  const get = (k: string): string | undefined => {
    const v = o.get(k);
    return typeof v === "string" ? v : undefined;
  };
  const sub = (k: string): Record<string, unknown> => {
    const cur = spec[k];
    const next = isObj(cur) ? { ...cur } : {};
    spec[k] = next;
    return next;
  };
  const v = (k: string, f: (x: string) => void): void => {
    const x = get(k);
    if (x !== undefined) f(x);
  };
  v("response", (x) => (spec["response"] = x));
  v("pass", (x) => (sub("passband")["edgeHz"] = edge(x)));
  v("pass-loss", (x) => (sub("passband")["maxLossDb"] = num(x)));
  v("pass-top", (x) => (sub("passband")["topHz"] = num(x)));
  v("stop", (x) => (sub("stopband")["edgeHz"] = edge(x)));
  v("stop-atten", (x) => (sub("stopband")["minAttenuationDb"] = num(x)));
  v("gain", (x) => {
    const g = sub("gain");
    delete g["vPerV"];
    g["db"] = num(x.replace(/\s*dB$/i, ""));
  });
  v("gain-vv", (x) => {
    const g = sub("gain");
    delete g["db"];
    g["vPerV"] = num(x);
  });
  v("polarity", (x) => (sub("gain")["polarity"] = x));
  v("family", (x) => (spec["family"] = x));
  v("priority", (x) => (spec["priority"] = x));
  v("order", (x) => (spec["order"] = num(x)));
  v("topology", (x) => (spec["topology"] = x.includes(",") ? x.split(",").map((s) => s.trim()) : x));
  v("caps", (x) => (sub("parts")["capacitorSeries"] = x.toUpperCase()));
  v("res", (x) => (sub("parts")["resistorSeries"] = x.toUpperCase()));
  v("r-min", (x) => (sub("parts")["resistorMinOhm"] = num(x)));
  v("r-max", (x) => (sub("parts")["resistorMaxOhm"] = num(x)));
  v("cap-tol", (x) => (sub("parts")["capacitorTolerance"] = fraction(x)));
  v("res-tol", (x) => (sub("parts")["resistorTolerance"] = fraction(x)));
  v("yield-target", (x) => (spec["yieldTarget"] = fraction(x)));
  v("distribution", (x) => (sub("parts")["distribution"] = x));
  v("input-peak", (x) => (sub("levels")["inputPeakV"] = num(x)));
  v("swing", (x) => (sub("levels")["outputSwingV"] = num(x)));
  const gbw = get("gbw");
  const a0 = get("a0");
  if (a0 !== undefined && gbw === undefined) throw new UsageError("--a0 needs --gbw as well");
  if (gbw !== undefined) {
    spec["opamp"] = gbw === "ideal" ? "ideal" : { a0: a0 === undefined ? 1e5 : num(a0), gbwHz: num(gbw) };
  }
  return spec;
}

function pad(s: string, n: number): string {
  return s.length >= n ? s : s + " ".repeat(n - s.length);
}

function table(rows: readonly (readonly string[])[]): string {
  const widths: number[] = [];
  for (const r of rows) r.forEach((c, i) => (widths[i] = Math.max(widths[i] ?? 0, c.length)));
  return rows.map((r) => r.map((c, i) => pad(c, widths[i] as number)).join("  ").trimEnd()).join("\n");
}

const hz = (x: number): string => formatValue(x, { digits: 4, unit: "Hz" });
const p4 = (x: number): string => Number(x.toPrecision(4)).toString();

/** The human-readable summary printed for a design. */
export function formatSummary(r: DesignResult, extra: readonly string[] = []): string {
  const v = r.verification;
  const out: string[] = [];
  out.push(
    `${r.family} ${r.spec.response}, ${r.filterOrder} poles in ${r.stages.length} stage${r.stages.length === 1 ? "" : "s"} (prototype order ${r.order}, minimum ${r.minimumOrder})`,
  );
  out.push(`why: ${r.familyChoice.reason}`, "");
  // Columns for the pole with the real op-amp, only when the design has them.
  const real = r.stages.some((s) => s.asBuiltWithOpamp !== undefined);
  const rows: string[][] = [
    [
      "stage",
      "topology",
      "kind",
      "f0 target",
      "f0 built",
      ...(real ? ["f0 w/ op-amp"] : []),
      "Q target",
      "Q built",
      ...(real ? ["Q w/ op-amp"] : []),
      "gain",
      "peak to here",
      "GBW need",
      "parts",
    ],
  ];
  for (const s of r.stages) {
    const w = s.asBuiltWithOpamp;
    rows.push([
      String(s.index),
      s.topology,
      s.kind,
      hz(s.target.f0Hz),
      hz(s.asBuilt.f0Hz),
      ...(real ? [w === undefined ? "-" : hz(w.f0Hz)] : []),
      s.target.q === undefined ? "-" : p4(s.target.q),
      s.asBuilt.q === undefined ? "-" : p4(s.asBuilt.q),
      ...(real ? [w?.q === undefined ? "-" : p4(w.q)] : []),
      p4(s.asBuilt.gain),
      `${(20 * Math.log10(s.peakGain)).toFixed(2)} dB`,
      hz(s.gbwDemandHz),
      Object.entries(s.components)
        .map(([k, x]) => `${k}=${formatValue(x, { digits: 3, unit: k.startsWith("C") ? "F" : "Ω", space: false })}`)
        .join(" "),
    ]);
  }
  out.push(table(rows), "");
  const s = r.spec;
  out.push(
    table([
      ["check", "as built", "spec", "margin"],
      ["passband loss", `${v.passbandLossDb.toFixed(3)} dB`, `<= ${s.maxLossDb} dB`, `${v.passbandMarginDb.toFixed(3)} dB`],
      ["stopband attenuation", `${v.stopbandAttenuationDb.toFixed(2)} dB`, `>= ${s.minAttenuationDb} dB`, `${v.stopbandMarginDb.toFixed(3)} dB`],
      ["gain", `${v.gainDb.toFixed(3)} dB`, `${v.targetGainDb.toFixed(3)} +- ${s.gainToleranceDb} dB`, `${v.gainMarginDb.toFixed(3)} dB`],
      ["polarity", v.polarity, s.polarity, v.polarityOk ? "ok" : "not met"],
    ]),
    "",
  );
  out.push(
    `${v.boardsMeetSpec ? "MEETS" : "DOES NOT MEET"} the spec: ${verdictLine(r)}; op-amp ${v.opamp.kind === "ideal" ? "ideal" : `GBW ${hz(v.opamp.gbwHz)}`}`,
  );
  const h = v.headroom;
  if (h !== undefined) {
    out.push(
      `headroom at ${p4(h.inputPeakV)} V peak in, ${p4(h.outputSwingV)} V swing: worst ${h.worstOpamp} ${h.worstMarginDb.toFixed(2)} dB${h.clips ? " (CLIPS)" : ""}`,
    );
  }
  if (r.warnings.length > 0) {
    out.push("", "warnings:");
    for (const w of r.warnings) out.push(`  - ${w.stage === undefined ? "" : `stage ${w.stage}: `}${w.message}`);
  }
  if (r.actions.length > 0) {
    out.push("", "steps taken:");
    for (const a of r.actions) out.push(`  - ${a.message}`);
  }
  if (extra.length > 0) out.push("", ...extra);
  out.push("", "cautions:");
  for (const c of DESIGN_CAUTIONS) out.push(`  - ${c}`);
  return `${out.join("\n")}\n`;
}

function writeOutputs(r: DesignResult, o: Map<string, string | true>, io: CliIo): void {
  const targets: [string, (x: DesignResult) => string][] = [
    ["json", toJson],
    ["netlist", (x) => toSpiceNetlist(x)],
    ["bom", toBomCsv],
    ["markdown", toMarkdown],
    ["svg", (x) => toSvgPlot(x)],
  ];
  for (const [k, f] of targets) {
    const path = o.get(k);
    if (typeof path === "string") {
      io.writeFile(path, f(r));
      io.stderr(`wrote ${path}\n`);
    }
  }
}

function design(spec: unknown, o: Map<string, string | true>, io: CliIo): number {
  // the spec comes from JSON or flags: designFilter validates it at run time
  const r = designFilter(spec as FilterSpec);
  const extra: string[] = [];
  const runs = o.get("yield");
  if (typeof runs === "string") {
    const seed = o.get("seed");
    const n = Number(runs);
    const sd = typeof seed === "string" ? Number(seed) : 1;
    if (!Number.isInteger(n) || n < 1 || n > 100000) throw new UsageError(`--yield needs a whole number of boards from 1 to 100000 (got ${runs})`);
    if (!Number.isInteger(sd)) throw new UsageError(`--seed needs a whole number (got ${String(seed)})`);
    const mc = monteCarlo(r, { runs: n, seed: sd });
    extra.push(
      `Monte Carlo: ${mc.runs} boards, resistors +-${(mc.tolerances.resistor * 100).toFixed(1)} %, capacitors +-${(mc.tolerances.capacitor * 100).toFixed(1)} % (uniform): ` +
        `${(mc.yield * 100).toFixed(1)} % meet the mask (+-${(mc.yieldStandardError * 100).toFixed(1)} %); ` +
        `worst margin ${mc.marginDb.min.toFixed(3)} dB, median ${mc.marginDb.median.toFixed(3)} dB`,
    );
  } else if (o.has("seed")) throw new UsageError("--seed belongs with --yield");
  const en = o.get("noise");
  if (typeof en === "string") {
    const density = (text: string, unit: string, flag: string): number => {
      try {
        return parseValue(text, { allowZero: true });
      } catch {
        throw new UsageError(`${flag} needs a noise density in ${unit}, such as 8n or 0 (got ${text})`);
      }
    };
    const inText = o.get("noise-in");
    const nz = noiseAnalysis(r, {
      opampVoltageNoise: density(en, "V/rtHz", "--noise"),
      ...(typeof inText === "string" ? { opampCurrentNoise: density(inText, "A/rtHz", "--noise-in") } : {}),
    });
    const [lo, hi] = nz.bandHz;
    const top = nz.topContributors
      .slice(0, 5)
      .map((c) => `${c.name} ${(c.powerFraction * 100).toFixed(1)} %`)
      .join(", ");
    extra.push(
      `output noise ${formatValue(lo, { digits: 3, unit: "Hz" })} to ${formatValue(hi, { digits: 3, unit: "Hz" })}: ` +
        `${formatValue(nz.totalRmsV, { digits: 3, unit: "V" })} rms at the output; largest contributors: ${top}`,
    );
  } else if (o.has("noise-in")) throw new UsageError("--noise-in belongs with --noise");
  if (o.get("sensitivity") === true) {
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
  if (o.get("quiet") === true) {
    io.stdout(
      `${r.verification.boardsMeetSpec ? "meets" : "does not meet"} the spec: ${r.family} order ${r.order}, ${verdictLine(r)}\n${extra.map((x) => `${x}\n`).join("")}`,
    );
  } else io.stdout(formatSummary(r, extra));
  writeOutputs(r, o, io);
  return r.verification.boardsMeetSpec ? 0 : 1;
}

/**
 * Run the command line.
 *
 * @param argv - arguments after the program name (e.g. `["design", "--spec", "a.json"]`)
 * @param io - output streams and file access
 * @returns the exit code (0 meets the spec or success, 1 spec not met, 2 bad input, 3 internal error)
 * @throws never (every failure becomes a message and an exit code)
 * @example
 * ```ts
 * runCli(["design", "--response", "lowpass", "--pass", "1k", "--pass-loss", "1", "--stop", "4k", "--stop-atten", "40"], io);
 * //=> 0
 * ```
 */
export function runCli(argv: readonly string[], io: CliIo): number {
  try {
    const { positional, options } = parseArgs(argv);
    if (options.get("version") === true) {
      io.stdout(`filterwright ${CLI_VERSION}\n`);
      return 0;
    }
    const command = positional[0];
    if (options.get("help") === true || command === undefined || command === "help") {
      io.stdout(USAGE);
      return command === undefined && options.get("help") !== true ? 2 : 0;
    }
    if (positional.length > 1) throw new UsageError(`unexpected argument "${positional[1]}"`);
    switch (command) {
      case "design": {
        let base: Record<string, unknown> = {};
        const file = options.get("spec");
        if (typeof file === "string") {
          let text: string;
          try {
            text = io.readFile(file);
          } catch (e) {
            throw new UsageError(`cannot read ${file}: ${e instanceof Error ? e.message : String(e)}`);
          }
          let parsed: unknown;
          try {
            parsed = JSON.parse(text);
          } catch (e) {
            throw new UsageError(`${file} is not valid JSON: ${e instanceof Error ? e.message : String(e)}`);
          }
          if (!isObj(parsed)) throw new UsageError(`${file} must hold a JSON object (the filter spec)`);
          base = parsed;
        }
        if (options.has("scenario")) throw new UsageError("--scenario belongs to the demo command");
        return design(specFromOptions(base, options), options, io);
      }
      case "demo": {
        const name = options.get("scenario");
        const key = typeof name === "string" ? name : "vibration";
        const sc = SCENARIOS[key];
        if (sc === undefined) throw new UsageError(`unknown scenario "${key}"; choose ${Object.keys(SCENARIOS).join(", ")}`);
        io.stdout(`demo: ${sc.title}\n${sc.story}\n\n`);
        return design(specFromOptions(sc.spec as unknown as Record<string, unknown>, options), options, io);
      }
      case "topologies": {
        const rows = [["id", "name", "order", "kinds", "op-amps", "inverting"]];
        for (const t of topologies) {
          rows.push([t.id, t.name, String(t.order), t.kinds.join(" "), String(t.opampCount), t.inverting ? "yes" : "no"]);
        }
        io.stdout(`${table(rows)}\n`);
        return 0;
      }
      default:
        throw new UsageError(`unknown command "${command}" (commands: design, demo, topologies)`);
    }
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr(`filterwright: ${e.message}\n`);
      return 2;
    }
    if (e instanceof SpecError) {
      io.stderr(`filterwright: the spec has ${e.issues.length} problem${e.issues.length === 1 ? "" : "s"}:\n`);
      for (const i of e.issues) {
        const got = "received" in i ? ` (received ${describeValue(i.received)})` : "";
        io.stderr(`  - ${i.path === "" ? "(spec)" : i.path}: ${i.message}${got}\n`);
      }
      return 2;
    }
    if (e instanceof FilterwrightError) {
      io.stderr(`filterwright: ${e.message}\n`);
      return 2;
    }
    io.stderr(`filterwright: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 3;
  }
}

/** The spec type the command line builds (re-exported for scenario files). */
export type { FilterSpec };
