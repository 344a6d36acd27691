#!/usr/bin/env node
/**
 * Put the live page into the docs site: docs/live/* (the page, its script,
 * its worker and its style) into <out>/ and the ES-module build (dist/**.js,
 * no CommonJS, no typings) into <out>/lib/, so the page loads the library as
 * plain modules with no bundler. Run after `npm run build` and typedoc.
 *
 * Usage: node scripts/build-live-page.mjs [out]   (default docs/api/live)
 */
import { cpSync, existsSync, mkdirSync, readdirSync, rmSync, statSync } from "node:fs";
import { dirname, join, relative, resolve } from "node:path";

const root = resolve(import.meta.dirname, "..");
const out = resolve(process.argv[2] ?? join(root, "docs", "api", "live"));
const dist = join(root, "dist");
if (!existsSync(join(dist, "index.js"))) {
  console.error("build-live-page: dist/index.js is missing; run `npm run build` first");
  process.exit(1);
}
rmSync(out, { recursive: true, force: true });
mkdirSync(join(out, "lib"), { recursive: true });
for (const f of readdirSync(join(root, "docs", "live"))) cpSync(join(root, "docs", "live", f), join(out, f));

let files = 0;
const walk = (dir) => {
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) walk(p);
    else if (name.endsWith(".js")) {
      const to = join(out, "lib", relative(dist, p));
      mkdirSync(dirname(to), { recursive: true });
      cpSync(p, to);
      files++;
    }
  }
};
walk(dist);
console.log(`live page: ${relative(root, out)} (${files} module files)`);
