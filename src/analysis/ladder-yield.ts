/**
 * Monte Carlo yield of an active ladder against a design's own mask: the
 * same boards, part spreads, mask check and stability verdict as
 * {@link monteCarlo} gives the design's biquad cascade, so the two
 * realisations of one spec can be compared board for board.
 *
 * Method: the ladder's whole circuit is one board stage
 * (src/evaluate/circuit-boards.ts: its transfer function as polynomials from
 * its nodal equations), every resistor and capacitor drawn within its
 * tolerance by the seeded streams of src/evaluate/boards.ts, each board
 * checked against the design's mask (src/evaluate/mask.ts) and counted as
 * failed when a pole of its characteristic polynomial is not in the open
 * left half-plane. The yield's standard error is sqrt(p (1 - p) / runs).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { checkCircuit } from "../circuit/validate.ts";
import type { DesignResult } from "../design/index.ts";
import { maskPlan, spanRadS } from "../design/verify.ts";
import { runBoards } from "../evaluate/boards.ts";
import { circuitBoardStage } from "../evaluate/circuit-boards.ts";
import type { ActiveLadder } from "../ladder/active/types.ts";
import { monteCarloSettings, spread, type MonteCarloOptions, type MonteCarloResult } from "./tolerance.ts";
import { withDisplay } from "../display.ts";
import { monteCarloBundle } from "./display.ts";
import { checkpoint, checkRunControl, watched } from "../evaluate/progress.ts";

function requireLadderFor(fn: string, result: DesignResult, ladder: unknown): ActiveLadder {
  if (ladder === null || typeof ladder !== "object") {
    throw new InvalidArgumentError({ fn, path: "ladder", received: ladder, message: "expected an active ladder from leapfrogLowpassLadder, fdnrLowpassLadder or gicHighpassLadder" });
  }
  const l = ladder as ActiveLadder;
  checkCircuit(fn, l.circuit);
  const nodes = new Set(l.circuit.elements.flatMap((e) => (e.kind === "OA" ? [e.out] : e.kind === "E" ? [e.a, e.b] : [e.a, e.b])));
  if (typeof l.output !== "string" || !nodes.has(l.output) || !l.circuit.elements.some((e) => e.kind === "V" && e.name === l.source)) {
    throw new InvalidArgumentError({ fn, path: "ladder.output", received: l.output, message: "expected the ladder's own output node and source, as its realisation returned them" });
  }
  if (l.response !== result.spec.response) {
    throw new InvalidArgumentError({ fn, path: "ladder.response", received: l.response, message: `the design's mask is a ${result.spec.response} one: realise a ${result.spec.response} ladder for it` });
  }
  if (!(l.frequencyScale > 0) || !Number.isFinite(l.frequencyScale)) {
    throw new InvalidArgumentError({ fn, path: "ladder.frequencyScale", received: l.frequencyScale, message: "expected the ladder's frequency scale (rad/s, > 0) as its realisation returned it" });
  }
  return l;
}

/**
 * Monte Carlo yield of an active ladder built for a design's spec: boards
 * with every resistor and capacitor drawn within its tolerance, checked
 * against the design's own mask exactly as {@link monteCarlo} checks the
 * design's cascade (same seeded draws, same mask figures, an unstable board
 * fails).
 *
 * @param result - the design whose mask (and default tolerances) the boards are checked against
 * @param ladder - the active ladder, as its realisation returned it (op-amps as it was built with)
 * @param options - boards, seed, tolerances (default: the spec's), distribution, progress and cancellation
 * @returns yield, its standard error, the tolerances used, the figures' spreads and the worst board by designator
 * @throws {@link InvalidArgumentError} for a design result, ladder or option that is not valid, or a
 *   ladder whose response is not the spec's
 * @throws {@link CancelledError} when the run is stopped (signal, time limit or progress callback)
 * @example
 * ```ts
 * const design = designFilter({ response: "lowpass", family: "chebyshev1", order: 7,
 *   passband: { edgeHz: 18000, maxLossDb: 0.25 }, stopband: { edgeHz: 26000, minAttenuationDb: 33 },
 *   parts: { resistorTolerance: 0.01, capacitorTolerance: 0.02 } });
 * // `ladder`: the normalised 7th-order Chebyshev I ladder of design.placement.designRippleDb (0.125 dB)
 * const leapfrog = leapfrogLowpassLadder(ladder, { edgeHz: design.placement.chosenHz });
 * activeLadderMonteCarlo(design, leapfrog, { runs: 1000, seed: 7 }).yield; //=> 0.784
 * monteCarlo(design, { runs: 1000, seed: 7 }).yield; //=> 0.037 (the design's biquad cascade)
 * ```
 */
export function activeLadderMonteCarlo(result: DesignResult, ladder: ActiveLadder, options: MonteCarloOptions = {}): MonteCarloResult {
  const fn = "activeLadderMonteCarlo";
  const settings = monteCarloSettings(fn, result, options);
  const l = requireLadderFor(fn, result, ladder);
  const control = checkRunControl(fn, "options", { onProgress: options.onProgress, signal: options.signal, timeLimitMs: options.timeLimitMs });
  return watched(fn, "options", control, () => {
    checkpoint("boards", "Monte Carlo boards of the ladder", { done: 0, total: settings.runs });
    const plan = maskPlan(result.spec);
    const span = spanRadS(plan.bands);
    const resistor = settings.resistorTolerance ?? result.spec.resistorTolerance;
    const capacitor = settings.capacitorTolerance ?? result.spec.capacitorTolerance;
    const stage = circuitBoardStage(l.circuit, {
      source: l.source,
      output: l.output,
      spanRadS: span,
      resistorTolerance: resistor,
      capacitorTolerance: capacitor,
      radiusRadS: l.frequencyScale,
    });
    const run = runBoards([stage], plan, { boards: settings.runs, seed: settings.seed, distribution: settings.distribution });
    const worstBoard: Record<string, number> = {};
    const values = run.worstValues[0] as Float64Array;
    stage.compiled.componentNames.forEach((name, i) => {
      worstBoard[name] = values[i] as number;
    });
    const p = run.passed / settings.runs;
    return withDisplay({
      runs: settings.runs,
      yield: p,
      yieldStandardError: Math.sqrt((p * (1 - p)) / settings.runs),
      tolerances: { resistor, capacitor },
      marginDb: spread(run.marginDb, "activeLadderMonteCarlo"),
      passbandLossDb: spread(run.passbandLossDb, "activeLadderMonteCarlo", "passbandLossDb"),
      stopbandAttenuationDb: spread(run.stopbandAttenuationDb, "activeLadderMonteCarlo", "stopbandAttenuationDb"),
      gainDb: spread(run.gainDb, "activeLadderMonteCarlo", "gainDb"),
      worstBoard,
    }, monteCarloBundle);
  });
}
