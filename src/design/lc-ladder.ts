/**
 * A passive doubly terminated LC ladder designed from a filter spec, end to
 * end: family and order, the prototype ladder placed inside the mask, scaled
 * to the terminations and the band, built from preferred-value lossy parts,
 * checked against the mask and proven on Monte Carlo boards.
 *
 * Method. The family and minimum order are the cascade's (family.ts
 * `chooseFamily`, with the equiripple margin levels of `choosePrototype`);
 * the ladder is synthesised by `ladderPrototype` (src/ladder/). An even-order
 * elliptic or Chebyshev II ladder realises the type b form, whose slack is
 * not the prototype's: when it cannot meet the mask (and the spec leaves the
 * order free) the next order is taken. The ladder's own transfer is placed
 * exactly as the cascade places its prototype (placement.ts: the interval of
 * the transform's free parameter in which the exact design meets the mask,
 * and its geometric middle). The ladder is scaled by `scaleLadder`, built by
 * `asBuiltLadder` (inductor Q as a series resistance at the edge or centre)
 * and its circuit from `ladderCircuit`.
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
 * inductance). The yield's 95 % interval is Wilson's (src/evaluate/yield.ts).
 *
 * Accuracy: the mask figures are those of the circuit's polynomials, within
 * 1e-6 dB of its nodal analysis at every band extreme and within 0.01 dB of
 * ngspice (test/design/lc-ladder.test.ts).
 *
 * @module
 */
import type { FamilyName } from "../approx/types.ts";
import { circuitToSpice } from "../circuit/spice.ts";
import { ladderCircuit, LADDER_SOURCE } from "../circuit/ladder.ts";
import { checkCircuit } from "../circuit/validate.ts";
import { FilterwrightError, InvalidArgumentError, UnrealisableError } from "../errors.ts";
import { circuitBoardStage, circuitPolynomials } from "../evaluate/circuit-boards.ts";
import { runBoards } from "../evaluate/boards.ts";
import { maskFigures, planMask, rationalSource, type MaskFigures, type MaskPlan, type ResponseSource } from "../evaluate/mask.ts";
import { wilsonInterval } from "../evaluate/yield.ts";
import { asBuiltLadder } from "../ladder/as-built.ts";
import { ladderPrototype } from "../ladder/ladder-prototype.ts";
import { ladderParts } from "../ladder/parts-list.ts";
import { scaleLadder } from "../ladder/scale.ts";
import type { ScaledLadder } from "../ladder/scaled-types.ts";
import type { LadderPrototype } from "../ladder/types.ts";
import { frequencyResponse } from "../tf/index.ts";
import type { Zpk } from "../tf/types.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireInteger, requireOptions } from "../validate.ts";
import { AUTO_MAX_ORDER, chooseFamily, choosePrototype, familyMinimumOrder } from "./family.ts";
import { readLcLadderOptions, type LcLadderOptions, type LcLadderPlan } from "./lc-ladder-options.ts";
import type { LcLadderDesign, LcLadderPlacement, LcLadderVerification } from "./lc-ladder-types.ts";
import { intervalWidth, placeInInterval, prototypeInterval, type FeasibleInterval } from "./placement.ts";
import { requireDesignSpec, validateSpec, type DesignSpec, type FilterSpec } from "./spec.ts";
import { maskBands, responseSpanHz, spanRadS } from "./verify.ts";

/** Highest prototype order {@link designLcLadder} builds. */
export const LC_LADDER_MAX_ORDER = AUTO_MAX_ORDER;

const FN = "designLcLadder";

/** The ladder's prototype for a family and order at the cascade's margin level (terminations normalised to a 1 ohm source). */
function prototypeAt(spec: DesignSpec, family: FamilyName, order: number, plan: LcLadderPlan): LadderPrototype {
  const p = choosePrototype(spec, family, order);
  return ladderPrototype({
    family,
    order,
    ...(p.rippleDb === undefined ? {} : { rippleDb: p.rippleDb }),
    ...(p.attenuationDb === undefined ? {} : { attenuationDb: p.attenuationDb }),
    ...(family === "bessel" ? { normalization: "magnitude" as const } : {}),
    form: plan.form,
    sourceOhms: 1,
    ...(plan.loadOhms === undefined ? {} : { loadOhms: plan.loadOhms / plan.sourceOhms }),
  });
}

/** A ladder synthesis error, re-raised as this function's with the option or spec field it is about. */
function reraised(e: unknown): never {
  if (!(e instanceof FilterwrightError) || e.fn !== "ladderPrototype") throw e;
  const path = e.path === "loadOhms" ? "options.loadOhms" : e.path === "form" ? "options.form" : "spec.order";
  const details = { fn: FN, path, received: e.received, message: e.reason };
  throw e instanceof UnrealisableError ? new UnrealisableError(details) : new InvalidArgumentError(details);
}

interface Chosen {
  readonly family: FamilyName;
  readonly order: number;
  readonly prototype: LadderPrototype;
  readonly interval: FeasibleInterval;
  readonly reason: string;
}

/** Family and order (the cascade's choice, or the spec's), the ladder at that order, raised while its type b form misses the mask. */
function chooseLadder(spec: DesignSpec, plan: LcLadderPlan): Chosen {
  const fixed = spec.order !== null;
  if (fixed) requireInteger(FN, "spec.order", spec.order, { min: 1, max: LC_LADDER_MAX_ORDER });
  let family: FamilyName;
  let start: number;
  let why: string;
  if (spec.family === "auto") {
    const c = chooseFamily(spec);
    family = c.family;
    start = spec.order ?? Math.min(c.order ?? LC_LADDER_MAX_ORDER, LC_LADDER_MAX_ORDER);
    why = c.choice.reason;
  } else {
    family = spec.family;
    start = spec.order ?? Math.min(familyMinimumOrder(spec, family, LC_LADDER_MAX_ORDER) ?? LC_LADDER_MAX_ORDER, LC_LADDER_MAX_ORDER);
    why = `The spec names the ${family} family.`;
  }
  for (let n = start; ; n++) {
    const last = fixed || n >= LC_LADDER_MAX_ORDER;
    let prototype: LadderPrototype;
    try {
      prototype = prototypeAt(spec, family, n, plan);
    } catch (e) {
      if (last || !(e instanceof UnrealisableError) || e.path !== "order") reraised(e);
      continue;
    }
    const interval = prototypeInterval(spec, prototype.transfer);
    if (intervalWidth(interval) >= 0 || last) {
      const raised = n > start ? ` Order ${n}: at order ${start} the ladder (its type b form) does not meet the mask.` : "";
      const order = fixed ? ` The spec fixes order ${n}.` : "";
      return { family, order: n, prototype, interval, reason: `${why}${order}${raised}` };
    }
  }
}

/** |H(0)| of a zpk system (its poles and zeros off the origin). */
function dcMagnitude(zpk: Zpk): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, p.im);
  return m;
}

/** The lossless ladder's passband level, V/V (see the module header). */
function losslessLevel(prototype: LadderPrototype, ripple: number | undefined): number {
  const dc = dcMagnitude(prototype.transfer);
  return prototype.family === "chebyshev1" && prototype.order % 2 === 0 ? dc * 10 ** ((ripple as number) / 20) : dc;
}

/** A zpk system (rad/s) as a mask source. */
function zpkSource(zpk: Zpk): ResponseSource {
  const one = new Float64Array(1);
  return {
    magnitudeSquared: (w, out) => {
      const h = frequencyResponse(zpk, w);
      for (let i = 0; i < w.length; i++) out[i] = (h.re[i] as number) ** 2 + (h.im[i] as number) ** 2;
    },
    magnitudeSquaredAt: (w) => {
      one[0] = w;
      const h = frequencyResponse(zpk, one);
      return (h.re[0] as number) ** 2 + (h.im[0] as number) ** 2;
    },
    realPartAt: (w) => {
      one[0] = w;
      return frequencyResponse(zpk, one).re[0] as number;
    },
  };
}

function placementOf(spec: DesignSpec, iv: FeasibleInterval): { placement: LcLadderPlacement; value: number } {
  const value = placeInInterval(iv, 0.5);
  const placement: LcLadderPlacement = {
    parameter: iv.parameter,
    lowHz: iv.low / TWO_PI,
    highHz: iv.high / TWO_PI,
    chosenHz: value / TWO_PI,
    ...(iv.centre === undefined || spec.response === "lowpass" || spec.response === "highpass" ? {} : { centreHz: iv.centre / TWO_PI }),
  };
  return { placement, value };
}

function scaled(spec: DesignSpec, prototype: LadderPrototype, placement: LcLadderPlacement, plan: LcLadderPlan): ScaledLadder {
  const r = spec.response;
  if (r === "lowpass" || r === "highpass") return scaleLadder(prototype, { response: r, edgeHz: placement.chosenHz, sourceOhms: plan.sourceOhms });
  return scaleLadder(prototype, { response: r, centreHz: placement.centreHz as number, bandwidthHz: placement.chosenHz, sourceOhms: plan.sourceOhms });
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
 * d.verification.meetsSpec; //=> true
 * ```
 */
export function designLcLadder(spec: FilterSpec, options: LcLadderOptions = {}): LcLadderDesign {
  const s = validateSpec(spec);
  const plan = readLcLadderOptions(FN, options, s);
  const chosen = chooseLadder(s, plan);
  const { placement } = placementOf(s, chosen.interval);
  const ladder = scaled(s, chosen.prototype, placement, plan);
  const asBuilt = asBuiltLadder(ladder, {
    inductorSeries: plan.inductorSeries,
    inductorTolerance: plan.inductorTolerance,
    capacitorSeries: s.capacitorSeries,
    capacitorTolerance: plan.capacitorTolerance,
    inductorQ: plan.inductorQ,
  });
  const circuit = ladderCircuit(asBuilt);
  const ripple = choosePrototype(s, chosen.family, chosen.order).rippleDb;
  const level = losslessLevel(chosen.prototype, ripple);
  const bands = maskBands(s);
  const mask: MaskPlan = planMask(bands, { maxLossDb: s.maxLossDb, minAttenuationDb: s.minAttenuationDb, gain: level, gainToleranceDb: Infinity, reference: level });
  const span = spanRadS(bands);
  const radius = TWO_PI * ("edgeHz" in ladder.placement ? ladder.placement.edgeHz : ladder.placement.centreHz);
  const compile = { source: LADDER_SOURCE, output: asBuilt.outputNode, spanRadS: span };
  const polys = circuitPolynomials(circuit, compile, radius);
  if (polys === null) {
    throw new UnrealisableError({ fn: FN, path: "spec", received: undefined, message: "the as-built ladder's nodal equations are singular; give the inductors a finite Q" });
  }
  const figures = maskFigures(rationalSource([polys]), mask);
  const exact = maskFigures(zpkSource(ladder.transfer), mask);
  const held = circuit.elements.filter((e) => e.kind === "R" && e.name !== "RS" && e.name !== "RL").map((e) => e.name);
  const stage = circuitBoardStage(circuit, {
    ...compile,
    resistorTolerance: plan.terminationTolerance,
    capacitorTolerance: plan.capacitorTolerance,
    inductorTolerance: plan.inductorTolerance,
    heldParts: held,
    radiusRadS: radius,
  });
  const run = runBoards([stage], mask, { boards: plan.boards, seed: plan.seed, distribution: s.partDistribution });
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
  };
  return Object.freeze({
    spec: s,
    family: chosen.family,
    order: chosen.order,
    form: plan.form,
    reason: chosen.reason,
    prototype: chosen.prototype,
    placement,
    levelDb: 20 * Math.log10(level),
    ladder,
    asBuilt,
    circuit,
    parts: ladderParts(asBuilt),
    inductorSeries: plan.inductorSeries,
    verification: verification(figures, exact, yieldPart),
  });
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
