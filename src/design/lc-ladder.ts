/**
 * A passive doubly terminated LC ladder designed from a filter spec, end to
 * end: family, order and placement (lc-ladder-choice.ts), the prototype
 * ladder scaled to the terminations and the band, built from
 * preferred-value lossy parts (lc-ladder-build.ts), checked against the
 * mask and proven on Monte Carlo boards.
 *
 * Levels. A passive ladder has no gain to set: its passband level is fixed
 * by the terminations, RL / (RS + RL) for every ladder whose passband is flat
 * at DC (or at its centre, or at infinity), and for an even-order Chebyshev I
 * ladder the level of its ripple peaks, RL / (RS + RL) 10^(ripple / 20). The
 * mask's loss and attenuation are measured from that lossless level, not
 * from the as-built peak, so the dissipation loss of finite-Q parts counts
 * against the passband (src/evaluate/mask.ts `reference`). The spec's gain,
 * polarity, op-amp, topology, signal-level and resistor fields do not apply
 * and are not read.
 *
 * Boards. The as-built circuit is one board stage
 * (src/evaluate/circuit-boards.ts): its transfer function as polynomials
 * from its nodal equations, every capacitor drawn within its tolerance and
 * every inductor within its own; the source and load resistances within
 * `terminationTolerance` (0 by default: they are the system's); the loss
 * resistances keep their values (an inductor's Q does not move with its
 * inductance). Verdicts and draws are src/evaluate/boards.ts's; the yield's
 * 95 % interval is Wilson's (src/evaluate/yield.ts).
 *
 * Accuracy: the mask figures are those of the circuit's polynomials, within
 * 1e-6 dB of its nodal analysis at every band extreme and within 0.01 dB of
 * ngspice (test/design/lc-ladder.test.ts).
 *
 * @module
 */
import { withDisplay } from "../display.ts";
import { lcLadderBundle } from "./display.ts";
import { circuitToSpice } from "../circuit/spice.ts";
import { checkCircuit } from "../circuit/validate.ts";
import { InvalidArgumentError } from "../errors.ts";
import { circuitBoardStage } from "../evaluate/circuit-boards.ts";
import { runBoards, type BoardRun } from "../evaluate/boards.ts";
import { maskFigures, type MaskFigures } from "../evaluate/mask.ts";
import { wilsonInterval } from "../evaluate/yield.ts";
import { ladderParts } from "../ladder/parts-list.ts";
import { requireInteger, requireOptions } from "../validate.ts";
import { zpkSource } from "./lc-ladder-build.ts";
import { chooseLadder } from "./lc-ladder-choice.ts";
import { readLcLadderOptions, type LcLadderOptions, type LcLadderPlan } from "./lc-ladder-options.ts";
import type { LcLadderBoard, LcLadderDesign, LcLadderVerification } from "./lc-ladder-types.ts";

export type { LcLadderBoard, LcLadderDesign, LcLadderPlacement, LcLadderVerification, LcLadderYield } from "./lc-ladder-types.ts";
export type { LcLadderOptions } from "./lc-ladder-options.ts";
import { requireDesignSpec, validateSpec, type FilterSpec } from "./spec.ts";
import type { LcLadderFilterSpec } from "./spec-types.ts";
import { responseSpanHz } from "./verify.ts";

const FN = "designLcLadder";

/** The run's worst board by element name (a passive ladder's boards are never singular nor put to the stability test, so its margin is finite). */
function worstBoardOf(names: readonly string[], run: BoardRun): LcLadderBoard {
  const v = run.worstValues[0] as Float64Array;
  const values: Record<string, number> = {};
  names.forEach((n, i) => {
    values[n] = v[i] as number;
  });
  return { index: run.worstBoard, marginDb: run.worstMarginDb, values: Object.freeze(values) };
}

function verification(figures: MaskFigures, exact: MaskFigures, yieldPart: LcLadderVerification["yield"]): LcLadderVerification {
  const marginDb = Math.min(figures.passbandMarginDb, figures.stopbandMarginDb);
  return {
    passbandLossDb: figures.passbandLossDb,
    passbandWorstHz: figures.passbandWorstHz,
    passbandMarginDb: figures.passbandMarginDb,
    stopbandAttenuationDb: figures.stopbandAttenuationDb,
    stopbandWorstHz: figures.stopbandWorstHz,
    stopbandMarginDb: figures.stopbandMarginDb,
    marginDb,
    meetsSpec: marginDb >= 0,
    exactMarginDb: Math.min(exact.passbandMarginDb, exact.stopbandMarginDb),
    yield: yieldPart,
  };
}

/**
 * Design a passive doubly terminated LC ladder from a filter spec: family
 * and order as the cascade chooses them (or the spec's), the prototype
 * ladder placed inside the mask, scaled to the terminations and the band,
 * built from preferred-value inductors (E12/E24, finite Q) and capacitors
 * (the spec's series), checked against the mask from the ladder's lossless
 * level, and its Monte Carlo boards built with every inductor and capacitor
 * drawn within its tolerance.
 *
 * @param spec - the spec `designFilter` takes (the mask, family, order and capacitor fields apply)
 * @param options - terminations, form, inductors, capacitor tolerance, boards, seed
 * @returns the design: choice, placement, ladder exact and as built, circuit, parts, verification with yield
 * @throws {@link SpecError} listing every problem of the spec
 * @throws {@link InvalidArgumentError} for an option or spec field out of range (the path names it, e.g. `options.inductorQ`)
 * @throws {@link UnrealisableError} when no ladder of this form has the terminations asked for (`options.loadOhms`)
 *   or the synthesis fails at a fixed order (`spec.order`)
 * @example
 * ```ts
 * const d = designLcLadder({ response: "lowpass", passband: { edgeHz: 30e6, maxLossDb: 1 },
 *   stopband: { edgeHz: 60e6, minAttenuationDb: 45 }, parts: { capacitorSeries: "E24", capacitorTolerance: 0.01 } },
 *   { inductorSeries: "E24", inductorTolerance: 0.02, inductorQ: 100, seed: 3 });
 * d.family; //=> "elliptic"
 * d.order; //=> 5
 * d.verification.meetsSpec; //=> true
 * d.verification.yield.fraction; //=> 0.997 (1000 boards)
 * ```
 */
export function designLcLadder(spec: FilterSpec | LcLadderFilterSpec, options: LcLadderOptions = {}): LcLadderDesign {
  const s = validateSpec(spec);
  const plan = readLcLadderOptions(FN, options, s);
  const chosen = chooseLadder(s, plan);
  const b = chosen.built;
  const exact = maskFigures(zpkSource(b.ladder.transfer), b.mask);
  const held = b.circuit.elements.filter((e) => e.kind === "R" && e.name !== "RS" && e.name !== "RL").map((e) => e.name);
  const stage = circuitBoardStage(b.circuit, {
    ...b.compile,
    resistorTolerance: plan.terminationTolerance,
    capacitorTolerance: plan.capacitorTolerance,
    inductorTolerance: plan.inductorTolerance,
    heldParts: held,
    radiusRadS: b.radius,
  });
  const run = runBoards([stage], b.mask, { boards: plan.boards, seed: plan.seed, distribution: s.partDistribution });
  const [lower95, upper95] = wilsonInterval(run.passed, run.boards);
  const yieldPart = {
    fraction: run.passed / run.boards,
    lower95,
    upper95,
    boards: run.boards,
    passed: run.passed,
    met: lower95 >= s.yieldTarget,
    target: s.yieldTarget,
    seed: plan.seed,
    distribution: s.partDistribution,
    inductorTolerance: plan.inductorTolerance,
    capacitorTolerance: plan.capacitorTolerance,
    terminationTolerance: plan.terminationTolerance,
    worstBoard: worstBoardOf(stage.compiled.componentNames, run),
  };
  return Object.freeze(withDisplay({
    spec: s,
    family: chosen.family,
    order: chosen.order,
    form: plan.form,
    reason: chosen.reason,
    prototype: b.candidate.prototype,
    placement: b.placement,
    levelDb: 20 * Math.log10(b.level),
    ladder: b.ladder,
    asBuilt: b.asBuilt,
    circuit: b.circuit,
    parts: ladderParts(b.asBuilt),
    inductorSeries: plan.inductorSeries,
    verification: verification(b.figures, exact, yieldPart),
    options: Object.freeze(usedOptions(plan)),
  }, lcLadderBundle));
}

/** The options of a plan as `designLcLadder` takes them (the load only when it was given). */
function usedOptions(plan: LcLadderPlan): LcLadderOptions {
  const { loadOhms, ...rest } = plan;
  return loadOhms === undefined ? rest : { ...rest, loadOhms };
}

/** Options of {@link lcLadderNetlist}. */
export interface LcLadderNetlistOptions {
  /**
   * Points per decade of the `.ac` sweep (1 to 10000), from a decade below
   * the lowest spec edge to a decade above the highest.
   * @defaultValue 100
   */
  readonly pointsPerDecade?: number;
}

/**
 * The SPICE netlist of a designed LC ladder as built: its circuit, an `.ac`
 * sweep over the spec's span and `.print ac vdb(out)`.
 *
 * @param design - from {@link designLcLadder}
 * @param options - sweep density
 * @returns the netlist text
 * @throws {@link InvalidArgumentError} when `design` is not a designed ladder or an option is out of range
 * @example
 * ```ts
 * lcLadderNetlist(designLcLadder(spec)).includes(".print ac vdb(out)"); //=> true
 * ```
 */
export function lcLadderNetlist(design: LcLadderDesign, options: LcLadderNetlistOptions = {}): string {
  const fn = "lcLadderNetlist";
  const d = requireOptions(fn, "design", design);
  const circuit = checkCircuit(fn, d["circuit"]);
  const spec = requireDesignSpec(fn, d["spec"], "design.spec");
  const asBuilt = d["asBuilt"] as { outputNode?: unknown } | undefined;
  const out = asBuilt !== null && typeof asBuilt === "object" ? asBuilt.outputNode : undefined;
  if (typeof out !== "string" || !circuit.elements.some((e) => e.kind !== "OA" && e.kind !== "E" && (e.a === out || e.b === out))) {
    throw new InvalidArgumentError({ fn, path: "design.asBuilt.outputNode", received: out, message: "expected the design as designLcLadder returned it" });
  }
  const o = requireOptions(fn, "options", options);
  const ppd = o["pointsPerDecade"] === undefined ? 100 : requireInteger(fn, "options.pointsPerDecade", o["pointsPerDecade"], { min: 1, max: 10000 });
  const [startHz, stopHz] = responseSpanHz(spec);
  return circuitToSpice(circuit, {
    ac: { pointsPerDecade: ppd, startHz, stopHz },
    comments: ["passive LC ladder: V(out) / V(VS) is the transfer; 0 dB at the source emf"],
    cards: [`.print ac vdb(${out})`],
  });
}
