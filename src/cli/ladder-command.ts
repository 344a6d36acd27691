/**
 * `filterwright ladder`: a passive doubly terminated LC ladder from the
 * same mask options as `design` (`designLcLadder`), its verdict on the
 * boards built from toleranced parts, and its JSON record, netlist, BOM and Markdown summary.
 *
 * @module
 */
import { FilterwrightError, SpecError } from "../errors.ts";
import { checkSpec, designLcLadder, lcLadderNetlist, type FilterSpec, type LcLadderDesign, type LcLadderOptions } from "../design/index.ts";
import { lcLadderMarkdown, lcLadderToJson, toLcLadderBomCsv } from "../report/index.ts";
import { formatValue } from "../units/index.ts";
import type { GivenOption } from "./args.ts";
import { CliProblem, CliProblems } from "./problems.ts";
import { writeOutputFiles } from "./outputs.ts";
import { inFlagTerms, issueLines, specFromOptions } from "./spec-options.ts";
import { table } from "./summary.ts";
import { quoted } from "./values.ts";
import { didYouMean } from "./suggest.ts";
import type { CliIo } from "./run.ts";

/** Where designLcLadder's option errors point: the flag that gave the option. */
const LADDER_FLAGS: Readonly<Record<string, string>> = {
  "options.sourceOhms": "source-ohms",
  "options.loadOhms": "load-ohms",
  "options.form": "form",
  "options.inductorSeries": "inductors",
  "options.inductorTolerance": "ind-tol",
  "options.inductorQ": "inductor-q",
  "options.boards": "boards",
};

/** The ladder options the flags give. */
function ladderOptions(o: ReadonlyMap<string, GivenOption>): LcLadderOptions {
  const num = (flag: string): number | undefined => {
    const v = o.get(flag)?.value;
    return typeof v === "number" ? v : undefined;
  };
  const text = (flag: string): string | undefined => o.get(flag)?.text;
  const entries: [keyof LcLadderOptions, unknown][] = [
    ["sourceOhms", num("source-ohms")],
    ["loadOhms", num("load-ohms")],
    ["form", text("form")],
    ["inductorSeries", text("inductors")],
    ["inductorTolerance", num("ind-tol")],
    ["inductorQ", num("inductor-q")],
    ["boards", num("boards")],
  ];
  return Object.fromEntries(entries.filter(([, v]) => v !== undefined)) as LcLadderOptions;
}

/** Design the ladder, or say in command-line terms why it cannot be designed. */
function designOrExplain(spec: Record<string, unknown>, source: { name: string | undefined; base: Record<string, unknown>; options: ReadonlyMap<string, GivenOption> }, earlier: readonly string[], failed: ReadonlySet<string>): LcLadderDesign {
  const o = source.options;
  const lines = [...earlier, ...issueLines(checkSpec(spec), source, failed)];
  if (lines.length > 0) throw new CliProblems(lines);
  try {
    return designLcLadder(spec as unknown as FilterSpec, ladderOptions(o));
  } catch (e) {
    if (e instanceof SpecError) throw new CliProblems(issueLines(e.issues, source));
    if (e instanceof FilterwrightError) {
      const flag = LADDER_FLAGS[e.path];
      const given = flag === undefined ? undefined : o.get(flag);
      if (given !== undefined) {
        const values = given.def.kind === "enum" ? given.def.values?.() : undefined;
        const hint = values === undefined ? "" : didYouMean(given.text, values);
        throw new CliProblem(`--${flag} ${quoted(given.text)}: ${e.reason}${hint} (${given.def.what}, e.g. --${flag} ${given.def.example})`);
      }
      throw new CliProblem(`cannot design this ladder: ${inFlagTerms(e.reason)}`);
    }
    throw e;
  }
}

/** The printed summary: the ladder, the verdict on the boards, the parts. */
function summary(d: LcLadderDesign): string {
  const v = d.verification;
  const y = v.yield;
  const pc = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;
  const ok = v.meetsSpec && y.met;
  const rows = [["designators", "part", "value", "tolerance", "requirement"], ...d.parts.map((p) => [p.designators.join(", "), p.part, p.valueText, p.toleranceText, p.requirement])];
  return [
    `${ok ? "MEETS" : "DOES NOT MEET"} the spec: ${d.spec.response} LC ladder, ${d.family} order ${d.order} (${d.form}), ${formatValue(d.ladder.sourceOhms, { unit: "Ω" })} source, ${formatValue(d.ladder.loadOhms, { unit: "Ω" })} load`,
    `nominal: passband loss ${v.passbandLossDb.toFixed(3)} dB, stopband attenuation ${v.stopbandAttenuationDb.toFixed(2)} dB, margin ${v.marginDb.toFixed(3)} dB (${v.meetsSpec ? "meets" : "misses"} the mask, from the lossless level ${d.levelDb.toFixed(2)} dB)`,
    `boards: ${pc(y.fraction)} of ${y.boards} [${pc(y.lower95)}, ${pc(y.upper95)}] at ${pc(y.inductorTolerance)} L / ${pc(y.capacitorTolerance)} C (target ${pc(y.target)}: ${y.met ? "met" : "NOT met"})`,
    d.reason,
    "",
    table(rows),
    "",
  ].join("\n");
}

/**
 * Run `filterwright ladder`.
 *
 * @param base - the spec file's contents (empty without --spec)
 * @param sourceName - the spec file's name
 * @param o - the options given
 * @param earlier - value problems already found
 * @param io - streams and files
 * @returns the exit code: 0 the boards meet the spec, 1 they do not
 */
export function ladderCommand(
  base: Record<string, unknown>,
  sourceName: string | undefined,
  o: ReadonlyMap<string, GivenOption>,
  earlier: { lines: readonly string[]; failed: ReadonlySet<string> },
  io: CliIo,
): number {
  const merged = specFromOptions(base, o);
  if (merged.problems.length > 0) throw new CliProblems([...earlier.lines, ...merged.problems]);
  const d = designOrExplain(merged.spec, { name: sourceName, base, options: o }, earlier.lines, earlier.failed);
  const toStdout = writeOutputFiles(o, io, [
    ["json", () => lcLadderToJson(d)],
    ["netlist", () => lcLadderNetlist(d)],
    ["bom", () => toLcLadderBomCsv(d)],
    ["markdown", () => lcLadderMarkdown(d)],
  ]);
  const say = toStdout === undefined ? io.stdout : io.stderr;
  const text = summary(d);
  say(o.get("quiet")?.value === true ? `${text.split("\n").slice(0, 3).join("\n")}\n` : text);
  if (toStdout !== undefined) io.stdout(toStdout);
  return d.verification.meetsSpec && d.verification.yield.met ? 0 : 1;
}
