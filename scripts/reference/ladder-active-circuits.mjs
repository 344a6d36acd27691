// Writes test/fixtures/ladder-active-circuits.json: the element lists of
// active ladders with single-pole op-amps, built by the package itself
// (dist/, so run `npm run build` first), for scripts/reference/
// ladder_active_poles.py to compute their poles with numpy. The test
// rebuilds each circuit from the sources and requires the same elements, so
// a change to a realisation shows as a stale fixture. Run:
//   npm run build && node scripts/reference/ladder-active-circuits.mjs && python3 scripts/reference/ladder_active_poles.py
import { readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..");
const pkg = JSON.parse(readFileSync(join(root, "package.json"), "utf8"));
const { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } = await import(pathToFileURL(join(root, "dist", "ladder", "active", "index.js")).href);
const { chebyshev1 } = await import(pathToFileURL(join(root, "dist", "approx", "index.js")).href);

/** The Chebyshev I ladder of odd order n, series inductor first (Matthaei, Young, Jones 1964, sec. 4.05). */
function chebyshevLadder(n, rippleDb) {
  const beta = Math.log(1 / Math.tanh(rippleDb / (40 / Math.LN10)));
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k) => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const b = (k) => gamma ** 2 + Math.sin((k * Math.PI) / n) ** 2;
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (b(k - 1) * g[k - 2]));
  const z = chebyshev1(n, { rippleDb });
  const elements = g.map((value, i) => ({ kind: i % 2 === 0 ? "series-L" : "shunt-C", value }));
  return { family: "chebyshev1", order: n, form: "series-first", sourceOhms: 1, loadOhms: 1, elements, transfer: { zeros: z.zeros, poles: z.poles, gain: z.gain / 2 } };
}

/** The elliptic ladders of test/fixtures/ladder-elliptic.json. */
function ellipticLadder(order) {
  const f = JSON.parse(readFileSync(join(root, "test", "fixtures", "ladder-elliptic.json"), "utf8"));
  const l = f.ladders.find((x) => x.order === order);
  const c = (pairs) => pairs.map(([re, im]) => ({ re, im }));
  return { family: "elliptic", order, form: l.form, sourceOhms: 1, loadOhms: 1, elements: l.elements, transfer: { zeros: c(l.transfer.zeros), poles: c(l.transfer.poles), gain: l.transfer.gain } };
}

const opamp = { kind: "single-pole", a0: 1e5, gbwHz: 3e6 };
const c7 = chebyshevLadder(7, 0.125);
const e5 = ellipticLadder(5);
const cases = [
  ["leapfrog Chebyshev I 7", leapfrogLowpassLadder(c7, { edgeHz: 18000, opamp, predistort: false }), 18000],
  ["leapfrog elliptic 5", leapfrogLowpassLadder(e5, { edgeHz: 3400, opamp, predistort: false }), 3400],
  ["FDNR Chebyshev I 7", fdnrLowpassLadder(c7, { edgeHz: 18000, opamp, predistort: false }), 18000],
  ["FDNR elliptic 5", fdnrLowpassLadder(e5, { edgeHz: 3400, opamp, predistort: false }), 3400],
  ["GIC highpass Chebyshev I 7", gicHighpassLadder(c7, { edgeHz: 300, opamp, predistort: false }), 300],
  ["GIC highpass elliptic 5", gicHighpassLadder(e5, { edgeHz: 1200, opamp, predistort: false }), 1200],
];
const circuits = cases.map(([name, f, edgeHz]) => ({ name, output: f.output, edgeHz, elements: f.circuit.elements }));
const path = join(root, "test", "fixtures", "ladder-active-circuits.json");
const source = `filterwright ${pkg.version} dist/ladder/active, single-pole op-amps a0 1e5, GBW 3 MHz (scripts/reference/ladder-active-circuits.mjs)`;
writeFileSync(path, `${JSON.stringify({ source, circuits }, null, 1)}\n`);
console.log("wrote", path);
