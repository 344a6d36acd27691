/**
 * Entry point of the `filterwright` command (built to `dist/cli/main.js`).
 *
 * @module
 */
import { readFileSync, writeFileSync } from "node:fs";
import { runCli } from "./run.ts";

// A reader that stops early (`filterwright ... --json - | head`) closes the pipe: finish quietly with the exit code so far.
for (const stream of [process.stdout, process.stderr]) {
  stream.on("error", (e: NodeJS.ErrnoException) => {
    if (e.code === "EPIPE") process.exit(process.exitCode ?? 0);
    throw e;
  });
}

process.exitCode = runCli(process.argv.slice(2), {
  stdout: (t) => process.stdout.write(t),
  stderr: (t) => process.stderr.write(t),
  readFile: (p) => readFileSync(p, "utf8"),
  readStdin: () => readFileSync(0, "utf8"),
  writeFile: (p, t) => writeFileSync(p, t, "utf8"),
  stderrIsTerminal: process.stderr.isTTY === true,
});
