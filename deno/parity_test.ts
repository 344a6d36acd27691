// Node and Deno give the same numbers for the same seed: the Monte Carlo
// boards (uniform and normal part draws), a design's margins, yield and
// response curve (on its log grid).
// The Deno side runs the sources; the Node side runs the built package
// (dist/index.js, made by `npm run build`, which CI runs first) in a child
// process. Agreement is required to 1e-12 relative (the two engines' Math.log,
// Math.exp and Math.cos may differ in the last bit).
import { designFilter, monteCarlo } from "../src/index.ts";

function assert(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(message);
}

/** The figures compared, computed with the library `lib` (the same code on both sides). */
const SCRIPT = `
const spec = { response: "bandpass", passband: { edgeHz: [300, 3400], maxLossDb: 1 }, stopband: { edgeHz: [100, "10k"], minAttenuationDb: 30 } };
const r = lib.designFilter(spec);
const out = { margin: r.verification.marginDb, yield: r.verification.yield.fraction, grid: r.verification.curve.freqHz, curve: r.verification.curve.magnitudeDb };
for (const distribution of ["uniform", "normal"]) {
  const mc = lib.monteCarlo(r, { runs: 400, seed: 12345, distribution });
  out[distribution] = [mc.yield, mc.marginDb.min, mc.marginDb.median, mc.marginDb.max, mc.passbandLossDb.median, mc.stopbandAttenuationDb.median, mc.gainDb.median, ...Object.values(mc.worstBoard)];
}
`;

function compute(lib: { designFilter: typeof designFilter; monteCarlo: typeof monteCarlo }): Record<string, number | number[]> {
  return new Function("lib", `${SCRIPT}; return out;`)(lib) as Record<string, number | number[]>;
}

Deno.test({
  name: "the same seed gives the same Monte Carlo boards, grid and margins under Node and Deno (1e-12 relative)",
  permissions: { read: true, run: ["node"], env: true },
  fn: async () => {
    const dist = new URL("../dist/index.js", import.meta.url);
    try {
      await Deno.stat(dist);
    } catch {
      throw new Error("dist/index.js is missing: run `npm run build` before `npm run test:deno`");
    }
    const ours = compute({ designFilter, monteCarlo });
    const child = new Deno.Command("node", {
      args: ["--input-type=module", "-e", `import * as lib from ${JSON.stringify(dist.href)};\n${SCRIPT}\nprocess.stdout.write(JSON.stringify(out));`],
      stdout: "piped",
      stderr: "piped",
    });
    const res = await child.output();
    assert(res.success, `node failed: ${new TextDecoder().decode(res.stderr)}`);
    const theirs = JSON.parse(new TextDecoder().decode(res.stdout)) as Record<string, number | number[]>;
    let compared = 0;
    for (const [k, v] of Object.entries(ours)) {
      const a = Array.isArray(v) ? v : [v];
      const w = theirs[k];
      const b = Array.isArray(w) ? w : [w as number];
      assert(a.length === b.length && a.length > 0, `${k}: ${a.length} values under Deno, ${b.length} under Node`);
      a.forEach((x, i) => {
        const y = b[i] as number;
        assert(Number.isFinite(x) && Number.isFinite(y), `${k}[${i}]: not finite (${x}, ${y})`);
        const d = Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y), 1e-300);
        assert(x === y || d <= 1e-12, `${k}[${i}]: Deno ${x}, Node ${y} (relative ${d})`);
        compared++;
      });
    }
    assert(compared > 500, `compared only ${compared} numbers`);
  },
});
