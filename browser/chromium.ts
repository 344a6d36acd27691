/**
 * Headless Chromium (the Debian package `chromium`) for the browser tests:
 * a screenshot of a page, and the DOM of a page after its inline scripts ran.
 * Each run gets a fresh profile directory, removed afterwards, and the flags
 * that keep a headless browser from reaching the network on its own.
 *
 * The tests run when a Chromium binary is found (`CHROMIUM` names one, else
 * `chromium` or `chromium-browser` on the PATH); without one they are skipped
 * locally and FAIL under CI (the CI environment variable set), as the
 * ngspice tests do.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";

let found: string | null | undefined;

/** The Chromium binary, or null. */
export function chromiumBinary(): string | null {
  if (found === undefined) {
    found = null;
    for (const name of [process.env["CHROMIUM"], "chromium", "chromium-browser"]) {
      if (name === undefined || name === "") continue;
      const r = spawnSync(name, ["--version"], { encoding: "utf8" });
      if (r.status === 0 && /chrom/i.test(r.stdout ?? "")) {
        found = name;
        break;
      }
    }
  }
  return found;
}

/** Whether the browser tests run (see the module header). */
export function requireChromium(): boolean {
  return chromiumBinary() !== null || Boolean(process.env["CI"]);
}

export const CHROMIUM_FLAGS: readonly string[] = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-extensions",
  "--hide-scrollbars",
  "--force-device-scale-factor=1",
];

/** Run Chromium on a local file with extra flags; returns stdout. */
function run(file: string, extra: readonly string[]): string {
  const bin = chromiumBinary();
  if (bin === null) throw new Error("Chromium is required (the CI environment variable is set) but was not found: install the Debian package chromium, or set CHROMIUM");
  const profile = mkdtempSync(join(tmpdir(), "fw-chromium-"));
  try {
    const r = spawnSync(bin, [...CHROMIUM_FLAGS, `--user-data-dir=${profile}`, ...extra, pathToFileURL(file).href], { encoding: "utf8", timeout: 120_000, maxBuffer: 64 * 1024 * 1024 });
    if (r.status !== 0) throw new Error(`chromium exited with ${r.status ?? r.signal}: ${(r.stderr ?? "").slice(-2000)}`);
    return r.stdout;
  } finally {
    rmSync(profile, { recursive: true, force: true });
  }
}

/**
 * A screenshot of a page, as PNG bytes.
 *
 * @param file - the HTML file
 * @param width - window width, pixels
 * @param height - window height, pixels
 * @param out - where to write the PNG
 * @returns the PNG file's bytes
 */
export function screenshot(file: string, width: number, height: number, out: string): Buffer {
  run(file, [`--screenshot=${out}`, `--window-size=${width},${height}`]);
  return readFileSync(out);
}

/**
 * The serialised DOM of a page after its scripts ran.
 *
 * @param file - the HTML file
 * @returns the HTML text
 */
export function dumpDom(file: string): string {
  return run(file, ["--dump-dom", "--virtual-time-budget=5000", "--window-size=1600,1200"]);
}
