/**
 * Writing the output files a command was asked for (`--netlist FILE`,
 * `--bom -`, ...): each to its file, or the one bound for standard output
 * returned, so the summary can go to standard error and the output be piped.
 *
 * @module
 */
import { CliProblem, ioReason } from "./problems.ts";
import type { GivenOption } from "./args.ts";
import type { CliIo } from "./run.ts";

/**
 * Write the outputs given among `renders` (flag, text maker), each rendered
 * only when asked for.
 *
 * @param o - the options given
 * @param io - files and streams
 * @param renders - output flags with the function that makes each text
 * @returns the text bound for standard output (at most one output asks for it), or undefined
 */
export function writeOutputFiles(o: ReadonlyMap<string, GivenOption>, io: CliIo, renders: readonly (readonly [string, () => string])[]): string | undefined {
  let toStdout: string | undefined;
  for (const [flag, render] of renders) {
    const path = o.get(flag)?.text;
    if (path === undefined) continue;
    const text = render();
    if (path === "-") {
      toStdout = text;
      continue;
    }
    try {
      io.writeFile(path, text);
    } catch (e) {
      throw new CliProblem(`cannot write ${path} (--${flag}): ${ioReason(e, true)}`);
    }
    io.stderr(`wrote ${path}\n`);
  }
  return toStdout;
}
