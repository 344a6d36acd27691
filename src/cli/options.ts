/**
 * The command line's options, one table: what each takes, which commands
 * accept it, which spec fields it sets (so the spec's issues are told back as
 * flags), which flags it cannot be used with, and its help line. The help
 * text, the argument reader and the error messages all come from this table.
 *
 * @module
 */
import { PLOT_KINDS } from "../report/svg.ts";
import { FAMILY_NAMES } from "../approx/index.ts";
import { MAX_SPEC_ORDER, type FamilyPriority, type Polarity, type ResponseType } from "../design/index.ts";
import type { PartDistribution } from "../design/spec.ts";
import { SERIES_NAMES } from "../parts/index.ts";
import { topologies } from "../topologies/index.ts";
import { SCENARIOS } from "./scenarios.ts";

/** The commands. */
export type Command = "design" | "demo" | "ladder" | "topologies";

/** Every command, for "did you mean". */
export const COMMANDS: readonly Command[] = ["design", "demo", "ladder", "topologies"];

/** How an option's value is read (see values.ts). */
export type ValueKind =
  | "none"
  | "enum"
  | "enum-list"
  | "edges"
  | "frequency"
  | "frequency-or-ideal"
  | "ohms"
  | "farads"
  | "volts"
  | "db"
  | "fraction"
  | "count"
  | "integer"
  | "order"
  | "plain-quantity"
  | "density-v"
  | "density-a"
  | "path";

/** One option of the command line. */
export interface OptionDef {
  /** The name without the two dashes. */
  readonly name: string;
  /** How its value is read (`"none"` for a flag that takes no value). */
  readonly kind: ValueKind;
  /** The placeholder of the value in the help text. */
  readonly placeholder: string;
  /** What the value is, for messages: "the largest passband loss in dB". */
  readonly what: string;
  /** A typical value, for messages: `0.5`. */
  readonly example: string;
  /** The help line. */
  readonly help: string;
  /** The commands that accept it. */
  readonly commands: readonly Command[];
  /** The spec fields it sets (dotted paths), if it is a spec option. */
  readonly paths?: readonly string[];
  /** A spec cannot be designed without it (unless a spec file gives the field). */
  readonly required?: boolean;
  /** The accepted names of an enum option (read when needed: the topology registry may grow). */
  readonly values?: () => readonly string[];
  /** Options it cannot be combined with, and why. */
  readonly conflicts?: Readonly<Record<string, string>>;
  /** The help section. */
  readonly section: "spec" | "output" | "general";
}

// Every member of each union, checked by the compiler: a new response, priority,
// polarity or distribution in the design layer fails the typecheck here until listed.
const RESPONSES: Readonly<Record<ResponseType, true>> = { lowpass: true, highpass: true, bandpass: true, bandstop: true };
const PRIORITIES: Readonly<Record<FamilyPriority, true>> = { "fewest-op-amps": true, "fewest-stages": true, "flattest-delay": true, monotonic: true };
const POLARITIES: Readonly<Record<Polarity, true>> = { "non-inverting": true, inverting: true, either: true };
const DISTRIBUTIONS: Readonly<Record<PartDistribution, true>> = { uniform: true, normal: true };

const DESIGNING: readonly Command[] = ["design", "demo"];
/** The options the passive LC ladder command shares with the active designs: the mask, the family and order, capacitors, yield. */
const MASK: readonly Command[] = ["design", "demo", "ladder"];

/** Every option, in help order. */
export const OPTIONS: readonly OptionDef[] = [
  { name: "response", kind: "enum", placeholder: "R", what: "the response", example: "lowpass", help: "lowpass | highpass | bandpass | bandstop", commands: MASK, paths: ["response"], required: true, values: () => Object.keys(RESPONSES), section: "spec" },
  { name: "pass", kind: "edges", placeholder: "F[,F2]", what: "the passband edge in Hz, or two separated by a comma", example: "20k", help: "passband edge(s), e.g. 20k or 300,3.4k (Hz)", commands: MASK, paths: ["passband.edgeHz"], required: true, section: "spec" },
  { name: "pass-loss", kind: "db", placeholder: "DB", what: "the largest passband loss in dB", example: "0.5", help: "largest passband loss (dB)", commands: MASK, paths: ["passband.maxLossDb"], required: true, section: "spec" },
  { name: "pass-top", kind: "frequency", placeholder: "F", what: "the top of the checked passband in Hz", example: "200k", help: "highpass/bandstop: check the passband up to F (default 100 x edge)", commands: MASK, paths: ["passband.topHz"], section: "spec" },
  { name: "stop", kind: "edges", placeholder: "F[,F2]", what: "the stopband edge in Hz, or two separated by a comma", example: "60k", help: "stopband edge(s) (Hz)", commands: MASK, paths: ["stopband.edgeHz"], required: true, section: "spec" },
  { name: "stop-atten", kind: "db", placeholder: "DB", what: "the smallest stopband attenuation in dB", example: "60", help: "smallest stopband attenuation (dB)", commands: MASK, paths: ["stopband.minAttenuationDb"], required: true, section: "spec" },
  { name: "gain", kind: "db", placeholder: "DB", what: "the passband gain in dB", example: "6", help: "passband gain in dB (default 0)", commands: DESIGNING, paths: ["gain.db"], conflicts: { "gain-vv": "both set the passband gain" }, section: "spec" },
  { name: "gain-vv", kind: "plain-quantity", placeholder: "X", what: "the passband gain in V/V (negative: inverting)", example: "2", help: "passband gain in V/V (negative: inverting)", commands: DESIGNING, paths: ["gain.vPerV"], conflicts: { gain: "both set the passband gain" }, section: "spec" },
  { name: "polarity", kind: "enum", placeholder: "P", what: "the gain's sign", example: "non-inverting", help: "non-inverting | inverting | either", commands: DESIGNING, paths: ["gain.polarity"], values: () => Object.keys(POLARITIES), section: "spec" },
  { name: "family", kind: "enum", placeholder: "NAME", what: "the approximation family", example: "butterworth", help: `auto (default) | ${FAMILY_NAMES.join(" | ")}`, commands: MASK, paths: ["family"], values: () => [...FAMILY_NAMES, "auto"], section: "spec" },
  { name: "priority", kind: "enum", placeholder: "P", what: "what the automatic family choice puts first", example: "fewest-stages", help: "fewest-op-amps (default) | fewest-stages | flattest-delay | monotonic", commands: MASK, paths: ["priority"], values: () => Object.keys(PRIORITIES), section: "spec" },
  { name: "order", kind: "order", placeholder: "N", what: `the prototype order, a whole number from 1 to ${MAX_SPEC_ORDER}`, example: "6", help: "fix the prototype order", commands: MASK, paths: ["order"], section: "spec" },
  { name: "topology", kind: "enum-list", placeholder: "ID", what: 'a topology id (see filterwright topologies), "auto", or one per stage separated by commas', example: "auto", help: "one topology for every stage, or ID1,ID2,... per stage (filterwright topologies lists them)", commands: DESIGNING, paths: ["topology"], values: () => [...topologies.map((t) => t.id), "auto"], section: "spec" },
  { name: "caps", kind: "enum", placeholder: "SERIES", what: "a capacitor series", example: "E12", help: `capacitor series (default E12): ${SERIES_NAMES.join(" ")}`, commands: MASK, paths: ["parts.capacitorSeries"], values: () => SERIES_NAMES, section: "spec" },
  { name: "res", kind: "enum", placeholder: "SERIES", what: "a resistor series", example: "E96", help: "resistor series (default E96)", commands: DESIGNING, paths: ["parts.resistorSeries"], values: () => SERIES_NAMES, section: "spec" },
  { name: "r-min", kind: "ohms", placeholder: "OHMS", what: "the smallest resistor in ohms", example: "1k", help: "resistor window, smallest (default: a decade below a level that follows the frequency, 10k x sqrt(1.59 kHz / f) held to 2k-316k)", commands: DESIGNING, paths: ["parts.resistorMinOhm"], section: "spec" },
  { name: "r-max", kind: "ohms", placeholder: "OHMS", what: "the largest resistor in ohms", example: "100k", help: "resistor window, largest (default: a decade above the same level)", commands: DESIGNING, paths: ["parts.resistorMaxOhm"], section: "spec" },
  { name: "c-min", kind: "farads", placeholder: "F", what: "the smallest capacitor in farads", example: "100p", help: "capacitor window, smallest (default 10p)", commands: DESIGNING, paths: ["parts.capacitorMinF"], section: "spec" },
  { name: "c-max", kind: "farads", placeholder: "F", what: "the largest capacitor in farads", example: "10u", help: "capacitor window, largest (default 10u)", commands: DESIGNING, paths: ["parts.capacitorMaxF"], section: "spec" },
  { name: "cap-tol", kind: "fraction", placeholder: "T", what: "the capacitor tolerance, a percentage or a fraction", example: "2%", help: "fix the capacitor tolerance, e.g. 2% or 0.02 (default 5 %, tightened per part if the yield needs it)", commands: MASK, paths: ["parts.capacitorTolerance"], section: "spec" },
  { name: "res-tol", kind: "fraction", placeholder: "T", what: "the resistor tolerance, a percentage or a fraction", example: "1%", help: "fix the resistor tolerance (default: the series' usual, tightened per part if the yield needs it)", commands: DESIGNING, paths: ["parts.resistorTolerance"], section: "spec" },
  { name: "yield-target", kind: "fraction", placeholder: "Y", what: "the fraction of boards that must meet the mask, a percentage or a fraction", example: "99%", help: "fraction of boards that must meet the mask, e.g. 99% or 0.99 (default 95%)", commands: MASK, paths: ["yieldTarget"], section: "spec" },
  { name: "distribution", kind: "enum", placeholder: "D", what: "the part spread within tolerance", example: "normal", help: "part spread within tolerance: uniform (default) | normal (tolerance = 3 sigma)", commands: MASK, paths: ["parts.distribution"], values: () => Object.keys(DISTRIBUTIONS), section: "spec" },
  { name: "input-peak", kind: "volts", placeholder: "V", what: "the largest input in volts peak", example: "1", help: "largest input (V peak); checks every op-amp output for clipping", commands: DESIGNING, paths: ["levels.inputPeakV"], section: "spec" },
  { name: "swing", kind: "volts", placeholder: "V", what: "the op-amp output swing in volts peak", example: "10", help: "op-amp output swing (V peak, default 10); checks every op-amp output for clipping", commands: DESIGNING, paths: ["levels.outputSwingV"], section: "spec" },
  { name: "opamp-en", kind: "density-v", placeholder: "EN", what: "the op-amp's voltage noise density in V/rtHz, such as 8n", example: "8n", help: "op-amp voltage noise (V/rtHz, e.g. 8n), counted in the design's dynamic range (default 0: resistors only)", commands: DESIGNING, paths: ["levels.opampVoltageNoise"], section: "spec" },
  { name: "opamp-in", kind: "density-a", placeholder: "IN", what: "the op-amp's current noise density in A/rtHz, such as 1p", example: "1p", help: "op-amp current noise (A/rtHz, e.g. 1p), counted in the design's dynamic range (default 0)", commands: DESIGNING, paths: ["levels.opampCurrentNoise"], section: "spec" },
  { name: "gbw", kind: "frequency-or-ideal", placeholder: "HZ", what: 'the op-amp gain-bandwidth in Hz, or "ideal"', example: "10M", help: "real op-amp (single pole) of this gain-bandwidth; default ideal", commands: DESIGNING, paths: ["opamp.gbwHz", "opamp"], section: "spec" },
  { name: "a0", kind: "plain-quantity", placeholder: "GAIN", what: "the op-amp open-loop gain in V/V", example: "1e5", help: "its open-loop gain (default 1e5; needs --gbw)", commands: DESIGNING, paths: ["opamp.a0"], section: "spec" },
  { name: "realisation", kind: "enum", placeholder: "R", what: "a realisation", example: "auto", help: "cascade (default) | active-ladder | auto: compare the cascade with the active ladders on the spec's yield boards and keep the one that meets the yield target with the fewest op-amps (filterwright ladder designs a passive LC ladder)", commands: DESIGNING, paths: ["realisation"], values: () => ["cascade", "active-ladder", "auto"], conflicts: { compare: "--realisation already compares the realisations, on the spec's yield boards" }, section: "spec" },
  { name: "spec", kind: "path", placeholder: "FILE", what: "a JSON spec file, or - for standard input", example: "spec.json", help: "read the spec from a JSON file (- reads standard input); spec options override its fields", commands: ["design", "ladder"], section: "spec" },
  { name: "scenario", kind: "enum", placeholder: "NAME", what: "a demo scenario", example: "vibration", help: `demo scenario: ${Object.keys(SCENARIOS).join(" | ")} (default vibration)`, commands: ["demo"], values: () => Object.keys(SCENARIOS), section: "spec" },
  { name: "source-ohms", kind: "ohms", placeholder: "R", what: "the source resistance", example: "50", help: "ladder: source resistance (default 50 Ω)", commands: ["ladder"], section: "spec" },
  { name: "load-ohms", kind: "ohms", placeholder: "R", what: "the load resistance", example: "50", help: "ladder: load resistance (default: equal, or what the family needs)", commands: ["ladder"], section: "spec" },
  { name: "form", kind: "enum", placeholder: "F", what: "the ladder's first arm", example: "shunt-first", help: "ladder: shunt-first (default) | series-first", commands: ["ladder"], values: () => ["shunt-first", "series-first"], section: "spec" },
  { name: "inductors", kind: "enum", placeholder: "SERIES", what: "an inductor series", example: "E24", help: "ladder: inductor series, E12 (default) | E24", commands: ["ladder"], values: () => ["E12", "E24"], section: "spec" },
  { name: "ind-tol", kind: "fraction", placeholder: "T", what: "the inductor tolerance, a percentage or a fraction", example: "5%", help: "ladder: inductor tolerance, e.g. 5% (default: the series' usual)", commands: ["ladder"], section: "spec" },
  { name: "inductor-q", kind: "plain-quantity", placeholder: "Q", what: "the inductors' quality factor", example: "80", help: "ladder: inductor Q at the edge or centre (default 50)", commands: ["ladder"], section: "spec" },
  { name: "boards", kind: "count", placeholder: "N", what: "a whole number of boards from 1 to 100000", example: "2000", help: "ladder: Monte Carlo boards of the yield check (default 1000)", commands: ["ladder"], section: "output" },
  { name: "json", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "result.json", help: "the design record as JSON", commands: MASK, section: "output" },
  { name: "netlist", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "filter.cir", help: "the SPICE netlist", commands: MASK, section: "output" },
  { name: "bom", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "bom.csv", help: "the bill of materials (CSV)", commands: MASK, section: "output" },
  { name: "markdown", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "design.md", help: "the design summary (Markdown)", commands: MASK, section: "output" },
  { name: "svg", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "response.svg", help: "a plot (SVG): the magnitude and the mask unless --plot names another kind", commands: DESIGNING, section: "output" },
  { name: "plot", kind: "enum", placeholder: "KIND", what: "a plot kind", example: "phase", help: `what --svg draws: ${PLOT_KINDS.join(" | ")} (default magnitude)`, commands: DESIGNING, values: () => [...PLOT_KINDS], section: "output" },
  { name: "sections", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "sos.csv", help: "the as-built second-order sections, scipy's analog sos rows (CSV; JSON when FILE ends in .json)", commands: DESIGNING, section: "output" },
  { name: "curves", kind: "path", placeholder: "FILE", what: "a file path, or - for standard output", example: "curves.csv", help: "magnitude, phase and group delay (CSV, 1000 points)", commands: DESIGNING, section: "output" },
  { name: "sensitivity", kind: "none", placeholder: "", what: "", example: "", help: "list each part's sensitivities (S^f0, S^Q, S^gain)", commands: DESIGNING, section: "output" },
  { name: "yield", kind: "count", placeholder: "N", what: "a whole number of boards from 1 to 100000", example: "500", help: "also build N boards with parts spread within their tolerance (Monte Carlo)", commands: DESIGNING, section: "output" },
  { name: "seed", kind: "integer", placeholder: "S", what: "a whole number", example: "7", help: "seed of the --yield boards (default 1; needs --yield)", commands: DESIGNING, section: "output" },
  { name: "compare", kind: "none", placeholder: "", what: "", example: "", help: "compare the cascade with active ladders of the same prototype on the same --yield boards and choose by yield and op-amps; --netlist, --bom and --markdown then write the chosen one", commands: DESIGNING, conflicts: { realisation: "--realisation already compares the realisations, on the spec's yield boards" }, section: "output" },
  { name: "noise", kind: "density-v", placeholder: "EN", what: "a noise density in V/rtHz, such as 8n, or 0 for resistors only", example: "8n", help: "output noise: resistors plus op-amp voltage noise EN (V/rtHz, e.g. 8n; 0 for resistors only)", commands: DESIGNING, section: "output" },
  { name: "noise-in", kind: "density-a", placeholder: "IN", what: "a noise density in A/rtHz, such as 1p", example: "1p", help: "and op-amp current noise IN (A/rtHz, e.g. 1p; needs --noise)", commands: DESIGNING, section: "output" },
  { name: "progress", kind: "none", placeholder: "", what: "", example: "", help: "report each step of a long run on standard error (family, search, yield candidates, boards)", commands: DESIGNING, section: "output" },
  { name: "quiet", kind: "none", placeholder: "", what: "", example: "", help: "print only the verification line", commands: MASK, section: "output" },
  { name: "help", kind: "none", placeholder: "", what: "", example: "", help: "this text (also -h)", commands: COMMANDS, section: "general" },
  { name: "version", kind: "none", placeholder: "", what: "", example: "", help: "the program version", commands: COMMANDS, section: "general" },
];

const BY_NAME = new Map(OPTIONS.map((o) => [o.name, o]));

/**
 * The option of a name (without dashes), if there is one.
 *
 * @param name - e.g. `"pass-loss"`
 * @returns its definition, or undefined
 */
export function optionNamed(name: string): OptionDef | undefined {
  return BY_NAME.get(name);
}

/** The outputs a design can write, in writing order. */
export const OUTPUT_OPTIONS = ["json", "netlist", "bom", "markdown", "svg", "sections", "curves"] as const;
