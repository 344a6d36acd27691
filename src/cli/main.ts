/**
 * Entry point of the `filterwright` command (built to `dist/cli/main.js`).
 *
 * @module
 */
import { readFileSync, writeFileSync } from "node:fs";
import { runCli } from "./run.ts";

process.exitCode = runCli(process.argv.slice(2), {
  stdout: (t) => process.stdout.write(t),
  stderr: (t) => process.stderr.write(t),
  readFile: (p) => readFileSync(p, "utf8"),
  writeFile: (p, t) => writeFileSync(p, t, "utf8"),
});
