/**
 * The topology framework: a topology file states its parts, its design
 * equations, its ideal figures and its closed-form response
 * ({@link TopologySpec}, in `spec.ts`); {@link defineTopology} turns that into a
 * {@link Topology} with the public checks, the realisable-range check,
 * impedance-level scaling, element placement, response evaluation (closed
 * form, or nodal analysis where the closed form takes only the ideal op-amp),
 * the GBW demand (`as-built.ts`), and, where the topology derives them, its
 * closed-form as-built polynomials (checked `polynomials`, unchecked
 * `polynomialsInto` for the hot path).
 *
 * Arguments are checked here, once, at the topology's public methods; the
 * topology files' equations and the kernels beneath are unchecked.
 *
 * @module
 */
import type { Circuit, Element, OpAmpModel } from "../circuit/types.ts";
import { assembleMna, checkStructure, solveMna } from "../circuit/mna.ts";
import { checkCircuit, checkOpAmpModel } from "../circuit/validate.ts";
import { InvalidArgumentError, UnrealisableError } from "../errors.ts";
import { TWO_PI } from "../units/constants.ts";
import { requirePositive } from "../validate.ts";
import { gbwDemand, polynomialPole, type AsBuiltPole } from "./as-built.ts";
import { openLoopGain, type PolynomialCore } from "./kernels.ts";
import { LIMIT_SLACK, type FiguresKernel, type PartSpec, type TopologySpec } from "./spec.ts";
import type {
  AsBuiltPolynomials,
  ComponentValues,
  PolynomialsInto,
  StageChoices,
  StageFigures,
  StagePlacement,
  StageTarget,
  Topology,
} from "./types.ts";

/**
 * Impedance level used when neither a capacitor nor a resistor is chosen: the level resistor is 10 kOhm.
 *
 * @internal
 */
export const DEFAULT_LEVEL_OHMS = 10_000;

/** Most GBW demands a topology keeps (then it starts again). */
const DEMAND_CACHE_SIZE = 4096;

/** A target as a key: every field the demand depends on, in a fixed order. */
function targetKey(t: StageTarget): string {
  return `${t.order} ${t.kind} ${t.f0Hz} ${t.q} ${t.fzHz} ${t.realPoleHz} ${t.gain}`;
}

/**
 * The unchecked {@link PolynomialsInto} of a polynomial core: the op-amp
 * model turned into `1/A = g0 + g1 z`, the core run on zeroed scratch, the
 * result normalised (largest denominator coefficient 1) and written
 * descending, right-aligned; declines (0) when a non-zero coefficient does
 * not fit the arrays.
 */
function polynomialsIntoOf(form: { readonly degree: number; readonly core: PolynomialCore }): PolynomialsInto {
  const d = form.degree;
  const lowNum = new Float64Array(d + 1);
  const lowDen = new Float64Array(d + 1);
  return (x, opamp, scale, num, den) => {
    let g0 = 0;
    let g1 = 0;
    if (opamp.kind !== "ideal") {
      if (opamp.kind === "single-pole-rout" && opamp.routOhm !== 0) return 0;
      g0 = 1 / opamp.a0;
      g1 = scale / (TWO_PI * opamp.gbwHz);
    }
    lowNum.fill(0);
    lowDen.fill(0);
    form.core(x, g0, g1, scale, lowNum, lowDen);
    let big = 0;
    for (let k = 0; k <= d; k++) big = Math.max(big, Math.abs(lowDen[k] as number));
    if (!(big > 0) || !Number.isFinite(big)) return 0;
    const last = den.length - 1;
    for (let k = 0; k <= last; k++) {
      num[k] = 0;
      den[k] = 0;
    }
    for (let k = 0; k <= d; k++) {
      const n = (lowNum[k] as number) / big;
      if (!Number.isFinite(n)) return 0;
      if (k > last) {
        // arrays shorter than the degree (the ideal op-amp's top coefficients are 0): only zeros may be left out
        if (n !== 0 || lowDen[k] !== 0) return 0;
        continue;
      }
      num[last - k] = n;
      den[last - k] = (lowDen[k] as number) / big;
    }
    return scale;
  };
}

/** The checked `polynomials`, its unchecked core and the degree, for a spec that derives them. */
function polynomialMembers(
  spec: TopologySpec,
  componentNames: readonly string[],
  form: { readonly degree: number; readonly core: PolynomialCore },
): Pick<Topology, "polynomialDegree" | "polynomials" | "polynomialsInto"> {
  const polynomialsInto = polynomialsIntoOf(form);
  const d = form.degree;
  const polynomials = (v: ComponentValues, opamp: OpAmpModel): AsBuiltPolynomials | null => {
    const fn = `${spec.id}.polynomials`;
    checkValues(fn, componentNames, v);
    checkOpAmpModel(fn, "opamp", opamp);
    if (opamp.kind === "single-pole-rout" && opamp.routOhm !== 0) return null;
    const x = Float64Array.from(componentNames, (n) => v[n] as number);
    const num = new Float64Array(d + 1);
    const den = new Float64Array(d + 1);
    const scale = TWO_PI * spec.figures(v).f0Hz;
    if (!(Number.isFinite(scale) && scale > 0) || polynomialsInto(x, opamp, scale, num, den) === 0) {
      bad(fn, "values", v, "these component values are so far apart that the polynomial coefficients overflow; use values within a few decades of each other");
    }
    return { num: withoutLeadingZeros(num), den: withoutLeadingZeros(den), scale };
  };
  return { polynomialDegree: d, polynomials, polynomialsInto };
}

/** Copy without the leading zeros (at least the constant term stays). */
function withoutLeadingZeros(a: Float64Array): Float64Array {
  let first = 0;
  while (first < a.length - 1 && a[first] === 0) first++;
  return a.slice(first);
}

/** The kernel of a spec without one: its values in a record (one, reused) handed to its named `figures`. */
function recordFigures(spec: TopologySpec, names: readonly string[]): FiguresKernel {
  const record: Record<string, number> = {};
  return (x) => {
    for (let i = 0; i < names.length; i++) record[names[i] as string] = x[i] as number;
    return spec.figures(record);
  };
}

function bad(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

/**
 * Check the shape of a target and choices against a topology (finite,
 * positive, right order and kind, zero frequency present for notch kinds).
 *
 * @param fn - public function name
 * @param spec - the topology
 * @param t - target
 * @param c - choices
 * @returns nothing
 * @throws {@link InvalidArgumentError} with the path of the first problem
 * @example
 * ```ts
 * checkShape("sallen-key-lowpass-unity.design", spec, { order: 2, kind: "lowpass", f0Hz: -1, q: 1, gain: 1 }, {});
 * //=> throws InvalidArgumentError at "target.f0Hz"
 * ```
 */
export function checkShape(fn: string, spec: TopologySpec, t: StageTarget, c: StageChoices): void {
  checkTarget(fn, spec, t, true);
  if (c === null || typeof c !== "object") bad(fn, "choices", c, "expected a choices object (it may be empty)");
  for (const k of ["capacitor", "resistor", "capacitorRatio", "resistorRatio"] as const) {
    if (c[k] !== undefined) requirePositive(fn, `choices.${k}`, c[k]);
  }
}

/** The target half of {@link checkShape}; `withGain` false for a target whose gain the topology fixes. */
function checkTarget(fn: string, spec: TopologySpec, t: Omit<StageTarget, "gain"> & { readonly gain?: number }, withGain: boolean): void {
  if (t === null || typeof t !== "object") bad(fn, "target", t, `expected a stage target { order, kind, f0Hz, ${spec.order === 3 ? "q, realPoleHz, " : spec.order === 2 ? "q, " : ""}gain }`);
  if (t.order !== spec.order) {
    bad(fn, "target.order", t.order, `${spec.name} builds order-${spec.order} stages; choose a topology of order ${t.order}`);
  }
  if (!spec.kinds.includes(t.kind)) {
    bad(fn, "target.kind", t.kind, `${spec.name} realises ${spec.kinds.map((k) => `"${k}"`).join(", ")}; choose a topology for "${t.kind}"`);
  }
  requirePositive(fn, "target.f0Hz", t.f0Hz);
  if (spec.order >= 2) requirePositive(fn, "target.q", t.q);
  if (spec.order === 3) requirePositive(fn, "target.realPoleHz", t.realPoleHz);
  if (withGain && (typeof t.gain !== "number" || !Number.isFinite(t.gain) || t.gain === 0)) {
    bad(fn, "target.gain", t.gain, "expected a finite, non-zero gain (V/V, sign included)");
  }
  if (t.kind === "lowpass-notch" || t.kind === "highpass-notch") requirePositive(fn, "target.fzHz", t.fzHz);
  if (t.kind === "notch" && t.fzHz !== undefined) requirePositive(fn, "target.fzHz", t.fzHz);
}

/** Check a placement: node names and prefix strings, `rename` a function, a valid op-amp model. */
function checkPlacement(fn: string, p: StagePlacement): void {
  if (p === null || typeof p !== "object") bad(fn, "placement", p, "expected { input, output, nodePrefix, opamp }");
  for (const k of ["input", "output", "nodePrefix"] as const) {
    if (typeof p[k] !== "string") bad(fn, `placement.${k}`, p[k], "expected a string (a node name or prefix)");
  }
  if (p.rename !== undefined && typeof p.rename !== "function") {
    bad(fn, "placement.rename", p.rename, "expected a function from a local designator to the circuit's designator, or nothing");
  }
  checkOpAmpModel(fn, "placement.opamp", p.opamp);
}

/** Reason the target's kind-specific relations fail (notch side, gain sign), or null. */
function commonLimits(spec: TopologySpec, t: StageTarget): string | null {
  if (spec.inverting && t.gain > 0) {
    return `${spec.name} is inverting, so its gain is negative; give the stage a negative gain (invert elsewhere) or choose a non-inverting topology`;
  }
  if (!spec.inverting && t.gain < 0) {
    return `${spec.name} is non-inverting, so its gain is positive; give the stage a positive gain or choose an inverting topology`;
  }
  const fz = t.fzHz;
  if (t.kind === "lowpass-notch" && fz !== undefined && !(fz > t.f0Hz)) {
    return `a lowpass-notch section has its zero above its pole (fzHz > f0Hz); got fzHz = ${fz} and f0Hz = ${t.f0Hz}: use kind "highpass-notch" or "notch"`;
  }
  if (t.kind === "highpass-notch" && fz !== undefined && !(fz < t.f0Hz)) {
    return `a highpass-notch section has its zero below its pole (fzHz < f0Hz); got fzHz = ${fz} and f0Hz = ${t.f0Hz}: use kind "lowpass-notch" or "notch"`;
  }
  return null;
}

/** Reason the target's gain differs from a gain the topology fixes, or null. */
function fixedGainLimit(spec: TopologySpec, t: StageTarget): string | null {
  if (spec.fixedGain === undefined) return null;
  const g = spec.fixedGain(t);
  if (Math.abs(t.gain - g) > LIMIT_SLACK * Math.abs(g)) {
    return `${spec.name} has its gain fixed by its other figures at ${g} for this target; set the stage gain to ${g} or choose a topology with a free gain`;
  }
  return null;
}

function scaleToLevel(spec: TopologySpec, v: Record<string, number>, c: StageChoices): ComponentValues {
  let k: number;
  if (c.capacitor !== undefined) k = (v[spec.levelCapacitor] as number) / c.capacitor;
  else if (c.resistor !== undefined) k = c.resistor / (v[spec.levelResistor] as number);
  else k = DEFAULT_LEVEL_OHMS / (v[spec.levelResistor] as number);
  const out: Record<string, number> = {};
  for (const p of spec.parts) {
    if (p.kind === "OA") continue;
    const x = v[p.name] as number;
    out[p.name] = p.kind === "R" ? x * k : x / k;
  }
  // Exact values for the chosen part (no rounding through k).
  if (c.capacitor !== undefined) out[spec.levelCapacitor] = c.capacitor;
  else if (c.resistor !== undefined) out[spec.levelResistor] = c.resistor;
  return Object.freeze(out);
}

/**
 * Check component values: every named part present, finite and positive.
 *
 * @param fn - public function name
 * @param names - component names expected
 * @param v - values
 * @returns nothing
 * @throws {@link InvalidArgumentError} at `values.<name>`
 * @example
 * ```ts
 * checkValues("x.figures", ["R1"], { R1: -1 }); //=> throws at "values.R1"
 * ```
 */
export function checkValues(fn: string, names: readonly string[], v: ComponentValues): void {
  if (v === null || typeof v !== "object") bad(fn, "values", v, "expected component values keyed by designator");
  for (const n of names) requirePositive(fn, `values.${n}`, v[n]);
}

function checkFreqs(fn: string, f: Float64Array): void {
  if (!(f instanceof Float64Array)) bad(fn, "freqHz", f, "expected a Float64Array of frequencies in Hz");
  for (let i = 0; i < f.length; i++) {
    const x = f[i] as number;
    if (!Number.isFinite(x) || x < 0) bad(fn, `freqHz[${i}]`, x, "expected a finite frequency of 0 Hz or more");
  }
}

/**
 * Place a stage's parts in a circuit: external nodes mapped, internal nodes
 * prefixed, designators renamed, op-amps given the placement's model.
 *
 * @param parts - local parts
 * @param v - values
 * @param p - placement
 * @returns the elements
 * @throws never (inputs checked by the caller)
 * @example
 * ```ts
 * placeParts([{ kind: "R", name: "R1", a: "in", b: "x" }], { R1: 1e3 }, { input: "a", output: "b", nodePrefix: "s1_", opamp: { kind: "ideal" } });
 * //=> [{ kind: "R", name: "R1", a: "a", b: "s1_x", value: 1000 }]
 * ```
 */
export function placeParts(parts: readonly PartSpec[], v: ComponentValues, p: StagePlacement): Element[] {
  const node = (n: string): string => (n === "in" ? p.input : n === "out" ? p.output : n === "0" ? "0" : `${p.nodePrefix}${n}`);
  const name = (n: string): string => (p.rename === undefined ? n : p.rename(n));
  return parts.map((q): Element => {
    if (q.kind === "OA") {
      return { kind: "OA", name: name(q.name), inP: node(q.inP), inN: node(q.inN), out: node(q.out), model: p.opamp };
    }
    return { kind: q.kind, name: name(q.name), a: node(q.a), b: node(q.b), value: v[q.name] as number };
  });
}

/**
 * The stage alone, driven by `Vin` at node `in`, output at node `out` (for nodal analysis).
 *
 * @param spec - topology
 * @param v - component values
 * @param opamp - op-amp model for every op-amp
 * @returns the circuit
 * @throws never
 * @example
 * ```ts
 * stageCircuit(spec, values, { kind: "ideal" }).elements[0]; //=> { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }
 * ```
 */
export function stageCircuit(spec: TopologySpec, v: ComponentValues, opamp: OpAmpModel): Circuit {
  const elements: Element[] = [
    { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
    ...placeParts(spec.parts, v, { input: "in", output: "out", nodePrefix: "x_", opamp }),
  ];
  return { title: spec.name, elements };
}

/**
 * The unchecked numeric core of a topology built by {@link defineTopology},
 * for inner loops (the component search) that have already checked their
 * inputs: no argument checks, no error objects, no strings.
 *
 * @internal
 */
export interface TopologyCore {
  /**
   * Ideal figures of a set of values that holds every component of the
   * topology, each finite and positive (the public `figures` without its check).
   */
  readonly figures: (v: ComponentValues) => StageFigures;
  /** The same from the values in the order of `componentNames` (a kernel that reads no part by name where the topology has one). */
  readonly figuresAt: FiguresKernel;
  /** The pole frequency alone from the same array (the bits of `figuresAt(x).f0Hz`), where the topology has a cheaper way to it. */
  readonly f0At?: (x: Float64Array) => number;
  /**
   * Why a well-formed target cannot be realised with these choices, or null
   * (the public `check` without the shape check of its arguments).
   */
  readonly check: (t: StageTarget, c: StageChoices) => string | null;
  /**
   * Values that realise a target the topology's `check` accepts with these
   * choices (the public `design` without its checks), or null where the
   * design equations give a part that is not finite and positive.
   */
  readonly design: (t: StageTarget, c: StageChoices) => ComponentValues | null;
}

const cores = new WeakMap<Topology, TopologyCore>();

/**
 * The unchecked core of a topology built by {@link defineTopology}.
 *
 * @param t - a topology
 * @returns its core, or undefined for a topology made some other way (use its public methods then)
 * @throws never
 * @example
 * ```ts
 * topologyCore(getTopology("mfb-lowpass"))?.figures({ R1: 1e4, R2: 1e4, R3: 1e4, C1: 1e-8, C2: 1e-9 }).f0Hz; //=> 5032.92...
 * ```
 * @internal
 */
export function topologyCore(t: Topology): TopologyCore | undefined {
  return cores.get(t);
}

/** The first of `names` whose value is missing, not finite or not positive. */
function firstUnusable(v: ComponentValues, names: readonly string[]): string | undefined {
  for (const n of names) {
    const x = v[n];
    if (x === undefined || !Number.isFinite(x) || x <= 0) return n;
  }
  return undefined;
}

/**
 * Build a {@link Topology} from a specification: adds argument checks, the
 * realisable-range check, impedance-level scaling, element placement,
 * response evaluation and the GBW demand.
 *
 * @param spec - the topology's own equations and parts
 * @returns the topology
 * @throws never
 * @example
 * ```ts
 * const t = defineTopology(spec); t.id; //=> spec.id
 * ```
 */
export function defineTopology(spec: TopologySpec): Topology {
  const componentNames = Object.freeze(spec.parts.filter((p) => p.kind !== "OA").map((p) => p.name));
  const opampCount = spec.parts.filter((p) => p.kind === "OA").length;
  const reason = (fn: string, t: StageTarget, c: StageChoices): string | null => {
    checkShape(fn, spec, t, c);
    return commonLimits(spec, t) ?? spec.limits(t, c) ?? fixedGainLimit(spec, t);
  };
  const check = (t: StageTarget, c: StageChoices): string | null => {
    try {
      return reason(`${spec.id}.check`, t, c ?? {});
    } catch (e) {
      if (e instanceof InvalidArgumentError) return e.message;
      throw e;
    }
  };
  const designFn = (t: StageTarget, c: StageChoices = {}): ComponentValues => {
    const fn = `${spec.id}.design`;
    const why = reason(fn, t, c);
    if (why !== null) throw new UnrealisableError({ fn, path: "target", received: t, message: why });
    const v = scaleToLevel(spec, spec.solve(t, c), c);
    const n = firstUnusable(v, componentNames);
    if (n !== undefined) {
      throw new UnrealisableError({
        fn,
        path: `values.${n}`,
        received: v[n],
        message: "the design equations gave no usable value for this part (the target lies at the edge of the range); move Q, gain or the ratios slightly",
      });
    }
    return v;
  };
  const figures = (v: ComponentValues): StageFigures => {
    checkValues(`${spec.id}.figures`, componentNames, v);
    return spec.figures(v);
  };
  const response = (v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel) => {
    const fn = `${spec.id}.response`;
    checkValues(fn, componentNames, v);
    checkFreqs(fn, freqHz);
    checkOpAmpModel(fn, "opamp", opamp);
    const m = freqHz.length;
    if (opamp?.kind === "ideal" || (opamp?.kind === "single-pole" && spec.closedFormFinite)) {
      const re = new Float64Array(m);
      const im = new Float64Array(m);
      for (let i = 0; i < m; i++) {
        const s = { re: 0, im: TWO_PI * (freqHz[i] as number) };
        const h = spec.closedForm(v, s, opamp.kind === "ideal" ? null : openLoopGain(opamp, s));
        re[i] = h.re;
        im[i] = h.im;
      }
      return { re, im };
    }
    const circuit = checkCircuit(fn, stageCircuit(spec, v, opamp));
    let dc = false;
    for (let i = 0; i < m; i++) if (freqHz[i] === 0) dc = true;
    checkStructure(fn, circuit, dc);
    const sys = assembleMna(circuit);
    const [r] = solveMna(fn, sys, {
      sourceRow: sys.sourceRow.get("Vin") as number,
      outputs: [sys.nodeIndex.get("out") as number],
      freqHz,
    });
    return r as { re: Float64Array; im: Float64Array };
  };
  const elements = (v: ComponentValues, p: StagePlacement): readonly Element[] => {
    const fn = `${spec.id}.elements`;
    checkValues(fn, componentNames, v);
    checkPlacement(fn, p);
    const out = placeParts(spec.parts, v, p);
    checkCircuit(fn, { title: spec.name, elements: out });
    return out;
  };
  const polynomialForm = spec.polynomials;
  const polynomialCore = polynomialForm === undefined ? undefined : polynomialsIntoOf(polynomialForm);
  const demandStage = {
    ...spec,
    circuit: (v: ComponentValues, opamp: OpAmpModel) => stageCircuit(spec, v, opamp),
    ...(polynomialForm === undefined || polynomialCore === undefined
      ? {}
      : {
          pole: (v: ComponentValues, opamp: OpAmpModel, order: 1 | 2, start: AsBuiltPole) =>
            polynomialPole(polynomialCore, polynomialForm.degree, Float64Array.from(componentNames, (n) => v[n] as number), opamp, order, start),
        }),
  };
  // The design loop asks for the same targets' demands again (every attempt re-plans its stages): kept per target, a few thousand at most.
  const demands = new Map<string, number>();
  const gbwDemandHz = (t: StageTarget): number => {
    const why = reason(`${spec.id}.gbwDemandHz`, t, {});
    if (why !== null) throw new UnrealisableError({ fn: `${spec.id}.gbwDemandHz`, path: "target", received: t, message: why });
    const key = targetKey(t);
    const known = demands.get(key);
    if (known !== undefined) return known;
    const d = gbwDemand(demandStage, designFn, t);
    if (demands.size >= DEMAND_CACHE_SIZE) demands.clear();
    demands.set(key, d);
    return d;
  };
  const ownGain = spec.fixedGain;
  const fixedGain =
    ownGain === undefined
      ? undefined
      : (t: Omit<StageTarget, "gain">): number => {
          checkTarget(`${spec.id}.fixedGain`, spec, t, false);
          return ownGain(t);
        };
  const topo: Topology = {
    id: spec.id,
    name: spec.name,
    order: spec.order,
    kinds: Object.freeze([...spec.kinds]),
    inverting: spec.inverting,
    opampCount,
    componentNames,
    reference: spec.reference,
    check,
    design: designFn,
    figures,
    response,
    elements,
    gbwDemandHz,
    ...(fixedGain === undefined ? {} : { fixedGain }),
    ...(spec.polynomials === undefined ? {} : polynomialMembers(spec, componentNames, spec.polynomials)),
  };
  Object.freeze(topo);
  cores.set(topo, {
    check: (t, c) => commonLimits(spec, t) ?? spec.limits(t, c) ?? fixedGainLimit(spec, t),
    figures: spec.figures,
    figuresAt: spec.figuresAt ?? recordFigures(spec, componentNames),
    ...(spec.f0At === undefined ? {} : { f0At: spec.f0At }),
    design: (t, c) => {
      const v = scaleToLevel(spec, spec.solve(t, c), c);
      return firstUnusable(v, componentNames) === undefined ? v : null;
    },
  });
  return topo;
}
