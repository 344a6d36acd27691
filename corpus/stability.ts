// The stability corpus (issue: no design meets the spec while a stage is
// unstable with its op-amp). Seeded random valid specs from
// scripts/spec-corpus.mjs, a third of them given slow op-amps (GBW only 3 to
// 30 times the highest spec edge, open-loop gain down to 5000), designed by
// the nominal pipeline; every stage of every design is checked independently
// of the pipeline's own Routh test: the roots of its characteristic
// polynomial from the generic nodal path (the stamp program, not the
// closed form), by the polynomial root finder. And the peak gains to every
// stage output and op-amp output are checked against a dense evaluation.
// The same designs carry the parts invariants (corpus/parts.ts): every part
// inside 100 Ω-10 MΩ / 10 pF-10 µF, none zero or negative, the op-amp
// estimate equal to the built count.
import { expect, it } from "vitest";
import { validateSpec } from "../src/design/spec.ts";
import type { searchDesign } from "../src/design/recovery.ts";
import { meetsSpec } from "../src/design/attempt.ts";
import { maskPlan, spanRadS } from "../src/design/verify.ts";
import { stagePolynomials } from "../src/evaluate/stage-polynomials.ts";
import { polyRoots } from "../src/math/roots.ts";
import { mulberry32 } from "../src/math/random.ts";
import { SpecError, UnrealisableError } from "../src/errors.ts";
import { boardStages } from "../src/design/attempt.ts";
import { peakSpanHz, stagePeakGains } from "../src/design/headroom.ts";
import { opampOutputTransfers } from "../src/evaluate/opamp-outputs.ts";
import { logGrid } from "../src/tf/index.ts";
import { denseCascadePeaks } from "../test/helpers/dense-peak.ts";
import { countPartsInvariants, emptyPartsTally, expectPartsInvariants, nominalDesign, type PartsTally } from "./parts.ts";
// @ts-expect-error plain JavaScript module without types
import { randomSpecs } from "../scripts/spec-corpus.mjs";

interface Tally {
  designs: number;
  met: number;
  unstableStages: number;
  unstableFlagged: number;
  skipped: number;
  peaksChecked: number;
  worstPeakDb: number;
}

const db = (x: number): number => 20 * Math.log10(x);

/**
 * The found peak gains to every stage output and op-amp output (as the
 * result reports them) against a dense evaluation: 200,000 log points over
 * the same span, every local maximum refined (test/helpers/dense-peak.ts).
 */
function checkPeaks(spec: ReturnType<typeof validateSpec>, attempt: ReturnType<typeof searchDesign>["attempt"], id: string, tally: Tally): void {
  const stages = boardStages(attempt.plans, attempt.chosen);
  const [lo, hi] = peakSpanHz(spec);
  const found = stagePeakGains(spec, stages, spec.opamp, logGrid(lo, hi, 2000));
  const span = spanRadS(maskPlan(spec).bands);
  const tapped = stages.map((s) => {
    const outs = opampOutputTransfers(s.topology, s.values, spec.opamp, span);
    return outs === null ? null : { output: outs.find((o) => o.node === "out")!.transfer, taps: outs.map((o) => o.transfer) };
  });
  if (tapped.some((t) => t === null)) return;
  const dense = denseCascadePeaks(tapped as { output: never; taps: never[] }[], [2 * Math.PI * lo, 2 * Math.PI * hi]);
  found.forEach((f, k) => {
    const d = dense[k]!;
    const e = Math.abs(db(f.output.gain) - 10 * Math.log10(d.output.magnitudeSquared));
    tally.worstPeakDb = Math.max(tally.worstPeakDb, e);
    expect(e, `${id}: stage ${k + 1} output peak against the dense evaluation`).toBeLessThan(0.01);
    f.opamps.forEach((p, j) => {
      const ej = Math.abs(db(p.gain) - 10 * Math.log10(d.taps[j]!.magnitudeSquared));
      tally.worstPeakDb = Math.max(tally.worstPeakDb, ej);
      expect(ej, `${id}: stage ${k + 1} op-amp output ${p.node} against the dense evaluation`).toBeLessThan(0.01);
    });
  });
  tally.peaksChecked++;
}

/** Design `n` specs of the corpus from `seed` and check the stability invariant on each. */
export function runStabilityCorpus(seed: number, n: number, parts: PartsTally = emptyPartsTally()): Tally {
  const rnd = mulberry32(seed ^ 0x5bd1e995);
  const tally: Tally = { designs: 0, met: 0, unstableStages: 0, unstableFlagged: 0, skipped: 0, peaksChecked: 0, worstPeakDb: 0 };
  for (const { id, spec } of randomSpecs(seed, n) as { id: string; spec: Record<string, unknown> }[]) {
    if (rnd() < 1 / 3) {
      const edges = [spec["passband"], spec["stopband"]].flatMap((b) => [(b as { edgeHz: number | number[] }).edgeHz].flat());
      const top = Math.max(...edges);
      spec["opamp"] = { a0: Math.round(5000 * 40 ** rnd()), gbwHz: Number((top * 3 * 10 ** rnd()).toPrecision(3)) };
    }
    let canonical;
    let attempt;
    let recounted;
    try {
      canonical = validateSpec(spec);
      recounted = nominalDesign(canonical).recounted;
      attempt = recounted.nominal.attempt;
    } catch (e) {
      if (e instanceof UnrealisableError || e instanceof SpecError) {
        tally.skipped++;
        continue;
      }
      throw e;
    }
    tally.designs++;
    countPartsInvariants(id, canonical, recounted, parts);
    const span = spanRadS(maskPlan(canonical).bands);
    const unstable: number[] = [];
    attempt.plans.forEach((p, i) => {
      const values = attempt.chosen[i]!.values;
      const poly = stagePolynomials(p.topology, values, canonical.opamp, { spanRadS: span, closedForm: false });
      if (poly === null) {
        unstable.push(i + 1);
        return;
      }
      const den = [...poly.den];
      while (den.length > 1 && den[0] === 0) den.shift();
      const roots = den.length > 1 ? polyRoots(den) : [];
      // a root within 1e-9 of the scale from the axis is too close to call by either method; the generic
      // path's sampled interpolation leaves noise coefficients above the true degree (a twin-T's network of
      // three capacitors, say), whose roots lie beyond 1e8 times the stage's scale, where no op-amp of the
      // corpus has a pole (its GBW is at most about 1e5 times the stage frequency): those are not poles
      const real = roots.filter((r) => Math.hypot(r.re, r.im) < 1e8);
      if (real.some((r) => r.re > 1e-9 * Math.hypot(r.re, r.im, 1))) unstable.push(i + 1);
    });
    tally.unstableStages += unstable.length;
    if (unstable.length > 0) {
      tally.unstableFlagged++;
      expect(attempt.mask.unstableStages, `${id}: the pipeline's stability verdict`).toEqual(unstable);
    }
    if (unstable.length === 0) checkPeaks(canonical, attempt, id, tally);
    const met = meetsSpec(canonical, attempt);
    if (met) tally.met++;
    expect(met && unstable.length > 0, `${id}: meets the spec with unstable stage(s) ${unstable.join(", ")}`).toBe(false);
  }
  return tally;
}

/**
 * The corpus test of one seed: `CORPUS_SIZE` specs (default 1000), the
 * invariants checked on each, the tally printed. One file per seed lets the
 * runner spread the corpus over the machine's cores.
 */
export function stabilityCorpusTest(label: string, seed: number): void {
  const n = Number(process.env["CORPUS_SIZE"] ?? 1000);
  it(`corpus ${label} (${n} specs, seed ${seed}): no design meets the spec with an unstable stage; peaks agree with a dense evaluation to 0.01 dB; every part inside 100 Ω-10 MΩ / 10 pF-10 µF, none zero or negative, op-amp count recorded = built, no family ranked below it`, () => {
    const parts = emptyPartsTally();
    const t = runStabilityCorpus(seed, n, parts);
    console.log(`stability corpus ${label}`, JSON.stringify(t));
    console.log(`parts corpus ${label}`, JSON.stringify(parts));
    expectPartsInvariants(parts, n);
    expect(t.designs + t.skipped).toBe(n);
    expect(t.designs).toBeGreaterThan(0.9 * n);
    expect(t.peaksChecked).toBeGreaterThan(0.8 * n);
  });
}
