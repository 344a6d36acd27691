/**
 * Reading the argument vector: the command, each option with its value read
 * strictly, and every problem found (unknown or misspelt options, missing
 * values, values given to flags that take none, options the command does not
 * take, repeated or conflicting options), each as one line.
 *
 * @module
 */
import { COMMANDS, OPTIONS, optionNamed, OUTPUT_OPTIONS, type Command, type OptionDef } from "./options.ts";
import { didYouMean } from "./suggest.ts";
import { quoted, readValue } from "./values.ts";

/** One option as given: the text typed and the value read from it. */
export interface GivenOption {
  /** The option. */
  readonly def: OptionDef;
  /** The value as typed (`""` for a flag). */
  readonly text: string;
  /** The value read (`true` for a flag). */
  readonly value: unknown;
}

/** The arguments as read. */
export interface ParsedArgs {
  /** The command, when one was given and is known. */
  readonly command: Command | undefined;
  /** The options given, by name. */
  readonly options: ReadonlyMap<string, GivenOption>;
  /** Every problem found but those of option values, one line each. */
  readonly problems: readonly string[];
  /** The problems of option values (such as `--order 0x4`), one line each. */
  readonly valueProblems: readonly string[];
  /** The options whose values could not be read. */
  readonly failed: ReadonlySet<string>;
  /** `--help` or `-h` was given. */
  readonly help: boolean;
  /** `--version` was given. */
  readonly version: boolean;
}

const NAMES = OPTIONS.map((o) => o.name);

/** What the last token set, to explain a stray argument after it. */
interface Last {
  readonly def: OptionDef;
  readonly text: string;
}

/** Read the arguments after the program name. */
export function readArgs(argv: readonly string[]): ParsedArgs {
  const problems: string[] = [];
  const raw = new Map<string, { def: OptionDef; text: string | undefined }>();
  const positional: { text: string; after: Last | undefined }[] = [];
  let help = false;
  let version = false;
  let last: Last | undefined;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i] as string;
    if (a === "-h") {
      help = true;
      last = undefined;
      continue;
    }
    if (!a.startsWith("--")) {
      if (/^-[A-Za-z]/.test(a)) {
        const name = a.slice(1).split("=")[0] as string;
        const starting = NAMES.filter((n) => n.startsWith(name));
        const meant = optionNamed(name) !== undefined ? name : starting.length === 1 ? starting[0] : undefined;
        const exact = meant === undefined ? "" : `; did you mean "--${meant}"?`;
        problems.push(`unknown option ${a.split("=")[0]}: options start with two dashes${exact} (filterwright --help lists them)`);
      } else positional.push({ text: a, after: last });
      last = undefined;
      continue;
    }
    const eq = a.indexOf("=");
    const name = eq >= 0 ? a.slice(2, eq) : a.slice(2);
    const def = optionNamed(name);
    if (def === undefined) {
      problems.push(`unknown option --${name}${didYouMean(name, NAMES, "--")} (filterwright --help lists the options)`);
      // Skip the value an unknown option was most likely given, so it is not reported again as a stray argument.
      const next = argv[i + 1];
      if (eq < 0 && next !== undefined && !next.startsWith("-") && positional.length > 0 && !(COMMANDS as readonly string[]).includes(next)) i++;
      last = undefined;
      continue;
    }
    let text: string | undefined;
    if (def.kind === "none") {
      if (eq >= 0) text = a.slice(eq + 1);
    } else if (eq >= 0) text = a.slice(eq + 1);
    else {
      const next = argv[i + 1];
      if (next === undefined) {
        problems.push(`--${name} needs a value (${def.what}, e.g. --${name} ${def.example}) but is the last argument`);
        continue;
      }
      if (next.startsWith("--")) {
        problems.push(`--${name} needs a value (${def.what}, e.g. --${name} ${def.example}) but is followed by ${next.split("=")[0]}`);
        continue;
      }
      text = next;
      i++;
    }
    if (name === "help" && text === undefined) help = true;
    if (name === "version" && text === undefined) version = true;
    if (raw.has(name)) {
      problems.push(`--${name} is given twice; give it once`);
      last = def.kind === "none" ? undefined : { def, text: text ?? "" };
      continue;
    }
    raw.set(name, { def, text });
    last = def.kind === "none" ? undefined : { def, text: text ?? "" };
  }
  const command = readCommand(positional, problems);
  if (positional[0]?.text === "help") help = true;
  const valueProblems: string[] = [];
  const failed = new Set<string>();
  const options = readOptions(raw, command, problems, valueProblems, failed);
  checkCombinations(options, problems);
  return { command, options, problems, valueProblems, failed, help, version };
}

/** The command (the first positional argument); every other positional argument is a problem. */
function readCommand(positional: readonly { text: string; after: Last | undefined }[], problems: string[]): Command | undefined {
  const first = positional[0];
  let command: Command | undefined;
  if (first !== undefined) {
    if ((COMMANDS as readonly string[]).includes(first.text)) command = first.text as Command;
    else if (first.text !== "help") {
      problems.push(`unknown command ${quoted(first.text)}${didYouMean(first.text, COMMANDS)} (commands: ${COMMANDS.join(", ")})`);
    }
  }
  for (const p of positional.slice(1)) {
    const why =
      p.after === undefined
        ? ""
        : ` after --${p.after.def.name} ${p.after.text}, which takes one value (${p.after.def.what}${p.after.def.kind === "edges" ? `: write both as --${p.after.def.name} ${p.after.text},${p.text}` : ""})`;
    problems.push(`unexpected argument ${quoted(p.text)}${why}`);
  }
  return command;
}

/** Each option's value read strictly, and whether the command takes it. */
function readOptions(
  raw: ReadonlyMap<string, { def: OptionDef; text: string | undefined }>,
  command: Command | undefined,
  problems: string[],
  valueProblems: string[],
  failed: Set<string>,
): Map<string, GivenOption> {
  const options = new Map<string, GivenOption>();
  for (const [name, { def, text }] of raw) {
    if (command !== undefined && !def.commands.includes(command)) {
      const where = def.commands.length === 0 ? "no command" : `the ${def.commands.join(" and ")} command${def.commands.length === 1 ? "" : "s"}`;
      problems.push(
        command === "topologies"
          ? `the topologies command takes no options (--${name} belongs to ${where})`
          : `--${name} belongs to ${where}, not to ${command}`,
      );
      continue;
    }
    if (def.kind === "none" && text === undefined) {
      options.set(name, { def, text: "", value: true });
      continue;
    }
    const read = readValue(def, text ?? "");
    if ("problem" in read) {
      valueProblems.push(read.problem);
      failed.add(name);
    } else options.set(name, { def, text: text ?? "", value: read.value });
  }
  return options;
}

/** Conflicting options, options that need another, and two outputs to one place. */
function checkCombinations(options: ReadonlyMap<string, GivenOption>, problems: string[]): void {
  const reported = new Set<string>();
  for (const [name, o] of options) {
    for (const [other, why] of Object.entries(o.def.conflicts ?? {})) {
      const key = [name, other].sort().join(" ");
      if (options.has(other) && !reported.has(key)) {
        reported.add(key);
        problems.push(`--${name} and --${other} cannot be used together (${why}); keep one`);
      }
    }
  }
  if (options.get("gbw")?.value === "ideal" && options.has("a0")) {
    problems.push("--gbw ideal and --a0 cannot be used together (an ideal op-amp has no open-loop gain to set); give --gbw a frequency such as 10M, or drop --a0");
  }
  const needs: [string, string, string][] = [
    ["seed", "yield", "--seed sets the boards of --yield; add e.g. --yield 500"],
    ["noise-in", "noise", "--noise-in needs --noise as well (the op-amp's voltage noise, e.g. --noise 8n, or --noise 0)"],
    ["plot", "svg", "--plot chooses what --svg draws; add e.g. --svg response.svg"],
  ];
  for (const [a, b, line] of needs) if (options.has(a) && !options.has(b)) problems.push(line);
  const byPlace = new Map<string, string>();
  for (const k of OUTPUT_OPTIONS) {
    const o = options.get(k);
    if (o === undefined) continue;
    const place = o.text;
    const before = byPlace.get(place);
    if (before !== undefined) {
      problems.push(
        place === "-"
          ? `--${before} and --${k} both write to standard output (-); send one of them to a file`
          : `--${before} and --${k} both write to ${quoted(place)}; give each its own file`,
      );
    } else byPlace.set(place, k);
  }
}
