/**
 * The topology specification: what a topology file states ({@link PartSpec},
 * {@link TopologySpec}) and the helpers it writes its equations with (named
 * and indexed value access, indexed figures kernels, output-node variants,
 * the limit slack). `define.ts` turns a specification into a topology.
 *
 * @module
 */
import type { ClosedForm, PolynomialCore } from "./kernels.ts";
import type { ComponentValues, StageChoices, StageFigures, StageKind, StageTarget } from "./types.ts";

/**
 * Relative slack used when comparing a target with an exact limit (rounding of the caller's arithmetic).
 *
 * @internal
 */
export const LIMIT_SLACK = 1e-9;

/**
 * The value of part `name` (ohms, farads) in a set of component values the
 * framework has already checked.
 *
 * @param v - component values
 * @param name - designator, e.g. `"R2"`
 * @returns the value
 * @throws never
 * @example
 * ```ts
 * valueOf({ R2: 4700 }, "R2"); //=> 4700
 * ```
 */
export function valueOf(v: ComponentValues, name: string): number {
  return v[name] as number;
}

/**
 * The conductance `1 / R` (siemens) of resistor `name`.
 *
 * @param v - component values
 * @param name - designator of a resistor
 * @returns the conductance
 * @throws never
 * @example
 * ```ts
 * conductanceOf({ R1: 1000 }, "R1"); //=> 0.001
 * ```
 */
export function conductanceOf(v: ComponentValues, name: string): number {
  return 1 / (v[name] as number);
}

/** A part of a stage in local terms: nodes `in`, `out`, `0` are external; any other node is internal. */
export type PartSpec =
  | { readonly kind: "R" | "C"; readonly name: string; readonly a: string; readonly b: string }
  | { readonly kind: "OA"; readonly name: string; readonly inP: string; readonly inN: string; readonly out: string };

/** Everything a topology file specifies; {@link defineTopology} adds the checks and shared behaviour. */
export interface TopologySpec {
  /** See {@link Topology.id}. */
  readonly id: string;
  /** See {@link Topology.name}. */
  readonly name: string;
  /** See {@link Topology.order}. */
  readonly order: 1 | 2 | 3;
  /** See {@link Topology.kinds}. */
  readonly kinds: readonly StageKind[];
  /** See {@link Topology.inverting}. */
  readonly inverting: boolean;
  /** See {@link Topology.reference}. */
  readonly reference: string;
  /** The capacitor whose value the `capacitor` choice sets. */
  readonly levelCapacitor: string;
  /** The resistor whose value the `resistor` choice sets (and which is 10 kOhm by default). */
  readonly levelResistor: string;
  /** The stage's parts, in BOM order (their names are the component names). */
  readonly parts: readonly PartSpec[];
  /** Topology-specific reason the (well-formed) target cannot be built, or null. */
  readonly limits: (t: StageTarget, c: StageChoices) => string | null;
  /** Values for a well-formed, realisable target at any impedance level (scaled afterwards). */
  readonly solve: (t: StageTarget, c: StageChoices) => Record<string, number>;
  /** Ideal figures from values. */
  readonly figures: (v: ComponentValues) => StageFigures;
  /**
   * The same figures from the values in component order (the parts without
   * the op-amps, see {@link partIndex}), unchecked, for inner loops; write
   * both at once with {@link indexedFigures}. Without it the framework fills
   * a record and calls `figures`.
   */
  readonly figuresAt?: FiguresKernel;
  /** The pole frequency alone (Hz) from the values in component order, the same bits as `figuresAt(x).f0Hz`, where it costs less (it bounds the search's error early). */
  readonly f0At?: (x: Float64Array) => number;
  /** Closed-form response. */
  readonly closedForm: ClosedForm;
  /** Whether `closedForm` handles a finite op-amp gain (else only `a = null`; MNA is used otherwise). */
  readonly closedFormFinite: boolean;
  /** Gain fixed by the other figures, if any. */
  readonly fixedGain?: (t: Omit<StageTarget, "gain">) => number;
  /** Closed-form polynomials, if derived: the highest degree (single-pole model) and the core. */
  readonly polynomials?: { readonly degree: number; readonly core: PolynomialCore };
}

/**
 * Where each part's value sits in a values array in component order (the
 * parts without the op-amps), for the polynomial cores and the figures kernels.
 *
 * @param parts - the stage's parts
 * @returns the index of each component by designator
 * @throws never
 * @example
 * ```ts
 * partIndex([{ kind: "R", name: "R1", a: "in", b: "a" }, { kind: "C", name: "C1", a: "a", b: "0" }]);
 * //=> { R1: 0, C1: 1 }
 * ```
 */
export function partIndex(parts: readonly PartSpec[]): Readonly<Record<string, number>> {
  const out: Record<string, number> = {};
  let i = 0;
  for (const p of parts) if (p.kind !== "OA") out[p.name] = i++;
  return Object.freeze(out);
}

/** Ideal figures from the values of a stage in component order (unchecked). */
export type FiguresKernel = (x: Float64Array) => StageFigures;

/** What {@link indexedFigures} builds from a topology's kernels. */
export interface IndexedFigures {
  /** The named figures the spec needs (values packed into an array, then the kernel). */
  readonly figures: (v: ComponentValues) => StageFigures;
  /** The kernel. */
  readonly figuresAt: FiguresKernel;
  /** The pole frequency alone, when given. */
  readonly f0At?: (x: Float64Array) => number;
}

/**
 * The indices (in component order) of the parts a shared piece of a family's
 * equations reads, typed by name, and a packer that puts named values into
 * one reused array in that order (for the closed forms that still take
 * named values; synchronous, so one array serves every call).
 *
 * @param parts - the parts every member of the family starts with
 * @param names - the designators wanted
 * @returns `at` (index by name) and `pack`
 * @throws Error when a name is not among the parts (a mistake in the topology file)
 * @example
 * ```ts
 * const { at, pack } = loopIndex(parts, ["R1", "C1"]);
 * pack({ R1: 1e3, C1: 1e-6 })[at.C1]; //=> 0.000001
 * ```
 */
export function loopIndex<K extends string>(
  parts: readonly PartSpec[],
  names: readonly K[],
): { readonly at: Readonly<Record<K, number>>; readonly pack: (v: ComponentValues) => Float64Array } {
  const index = partIndex(parts);
  const all = Object.keys(index);
  const at = {} as Record<K, number>;
  for (const n of names) {
    const i = index[n];
    if (i === undefined) throw new Error(`loopIndex: no part named ${n}`);
    at[n] = i;
  }
  const x = new Float64Array(all.length);
  const pack = (v: ComponentValues): Float64Array => {
    for (let i = 0; i < all.length; i++) x[i] = v[all[i] as string] as number;
    return x;
  };
  return { at: Object.freeze(at), pack };
}

/**
 * A topology's ideal figures written once, on the values in component order:
 * `make` receives the index of each designator and returns the kernel (and,
 * where cheaper, the pole frequency alone, computed by the same code the
 * kernel uses); the named `figures` of the spec packs its values and calls
 * that kernel, so both give the same bits.
 *
 * @param parts - the stage's parts
 * @param make - builds the kernels from `at(name)`, the index of a part (throws for a name the parts lack)
 * @returns the spec's `figures`, `figuresAt` and `f0At`
 * @throws Error when `make` asks for a part the stage does not have (a mistake in the topology file)
 * @example
 * ```ts
 * const f = indexedFigures(parts, (at) => { const r = at("R1"), c = at("C1"); return { figures: (x) => ({ f0Hz: 1 / (TWO_PI * x[r] * x[c]), gain: 1 }) }; });
 * f.figures({ R1: 1e3, C1: 1e-6 }).f0Hz; //=> 159.15494309189535
 * ```
 */
export function indexedFigures(
  parts: readonly PartSpec[],
  make: (at: (name: string) => number) => { readonly figures: FiguresKernel; readonly f0Hz?: (x: Float64Array) => number },
): IndexedFigures {
  const index = partIndex(parts);
  const names = Object.keys(index);
  const kernels = make((name) => {
    const i = index[name];
    if (i === undefined) throw new Error(`indexedFigures: no part named ${name}`);
    return i;
  });
  const figuresAt = kernels.figures;
  const x = new Float64Array(names.length);
  const figures = (v: ComponentValues): StageFigures => {
    for (let i = 0; i < names.length; i++) x[i] = v[names[i] as string] as number;
    return figuresAt(x);
  };
  return kernels.f0Hz === undefined ? { figures, figuresAt } : { figures, figuresAt, f0At: kernels.f0Hz };
}

/**
 * The parts with one local node renamed to the stage output `out` (for the
 * variants of a multi-amplifier stage that take their output from an
 * internal node and drop the output amplifier).
 *
 * @param parts - the parts in local terms
 * @param node - the local node that becomes `out`
 * @returns new part specs; the input is not changed
 * @throws never
 * @example
 * ```ts
 * withOutputAt([{ kind: "R", name: "R1", a: "in", b: "lp" }], "lp");
 * //=> [{ kind: "R", name: "R1", a: "in", b: "out" }]
 * ```
 */
export function withOutputAt(parts: readonly PartSpec[], node: string): PartSpec[] {
  const m = (n: string): string => (n === node ? "out" : n);
  return parts.map((p) => (p.kind === "OA" ? { ...p, inP: m(p.inP), inN: m(p.inN), out: m(p.out) } : { ...p, a: m(p.a), b: m(p.b) }));
}

/**
 * `x >= limit` with a relative slack of {@link LIMIT_SLACK}.
 *
 * @param x - value
 * @param limit - lower limit
 * @returns whether x reaches the limit
 * @throws never
 * @example
 * ```ts
 * atLeast(7.8399999999, 7.84); //=> true
 * ```
 */
export function atLeast(x: number, limit: number): boolean {
  return x >= limit * (1 - LIMIT_SLACK);
}
