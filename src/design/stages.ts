/**
 * From second-order sections to stage targets: what each stage realises, the
 * gain each stage carries, and the topology that builds it.
 *
 * Gain distribution follows the equal-peak rule of dynamic-range scaling: the
 * gain of stage i is set so that the largest magnitude over frequency at every
 * stage output equals the filter's passband level, so no internal node peaks
 * above the output and none sits needlessly low (L. T. Bruton, "RC-Active
 * Circuits: Theory and Design", 1980, sec. 9.6 on dynamic-range optimisation;
 * the idea in A. S. Sedra and P. O. Brackett, "Filter Theory and Design: Active
 * and Passive", 1978, ch. 11). Stages whose topology fixes the gain take the
 * nearest realisable gain and the remainder moves to later stages. Peaks are
 * taken on a dense log grid (160 points per decade plus each section's pole
 * frequency). A gain above twice `STAGE_GAIN_CAP` still to be placed is
 * shared instead: no stage before the last is asked for more than the larger
 * of the cap and an even share of what remains, so 40 dB does not land in one
 * stage with a large capacitor spread and GBW demand.
 *
 * One exception to the equal-peak rule saves op-amps (bounded-gain.ts): a
 * one-op-amp stage whose gain has a ceiling below its wish (the
 * single-amplifier highpass-notch's high-frequency gain is below unity) may
 * take 90 % of its ceiling when that leaves its output at most 1.4 dB below
 * the output level (the later stages make the rest up), and a last stage may
 * take it when the stages before it, lifted to make up the rest, peak at most
 * 1.4 dB above the output level and the cascade then needs fewer op-amps.
 * The search at each order and the yield ladder also try every stage at its
 * equal-peak gain (`gainBounds: "none"`) and keep that where the other
 * misses the mask or the yield target.
 *
 * Topology choice is rule-based (common practice, no source): Sallen-Key
 * unity gain for low-Q lowpass/highpass at unity gain, Sallen-Key with gain
 * for low Q above unity, multiple feedback for moderate Q, inverting stages or
 * attenuation below unity, and multi-amplifier state-variable/Tow-Thomas
 * stages for high Q and for sections with finite zeros. A single-op-amp stage
 * whose capacitor spread would exceed a decade pays for it in the score (two
 * points per further decade, against one point per extra op-amp), so Q above
 * roughly 2.5 moves to a multi-amplifier stage. A topology whose parts leave
 * the resistor window at every impedance level the planner probes
 * (components.ts `levelFit`) pays 1.5 points, and one whose parts cannot
 * even stay inside the hard limits (impedance-level.ts) is taken only when
 * no topology can.
 *
 * @module
 */
import type { Section, SectionCascade } from "../tf/types.ts";
import { frequencyResponse, logGrid } from "../tf/index.ts";
import type { StageKind, StageTarget, Topology } from "../topologies/types.ts";
import { getTopology, topologiesFor } from "../topologies/index.ts";
import { SpecError, UnrealisableError } from "../errors.ts";
import { TWO_PI } from "../units/constants.ts";
import type { DesignSpec } from "./spec.ts";
import { levelFit } from "./components.ts";
import { characteristicFrequencyHz, defaultResistorWindow } from "./impedance-level.ts";
import { boundedGain, BOUNDED_LEVEL_FLOOR } from "./bounded-gain.ts";

/** One section of the target, described for the topology layer. */
export interface SectionInfo {
  /** The section itself (rad/s; a third-order stage's pole pair). */
  readonly section: Section;
  /** A third-order stage's first-order section (rad/s), joined to `section` (third-order.ts). */
  readonly realSection?: Section;
  /** Stage kind. */
  readonly kind: StageKind;
  /** Order (3: a real pole and a pole pair in one stage). */
  readonly order: 1 | 2 | 3;
  /** Pole frequency, Hz (a third-order stage's pole pair). */
  readonly f0Hz: number;
  /** Pole Q (second and third order). */
  readonly q?: number;
  /** A third-order stage's real pole, Hz. */
  readonly realPoleHz?: number;
  /** Zero frequency, Hz (notch kinds). */
  readonly fzHz?: number;
  /** The section's own gain at its reference frequency (signed). */
  readonly refGain: number;
  /** |section / refGain| on the distribution grid. */
  readonly unitMag: Float64Array;
}

/** A stage target with its topology. */
export interface StagePlan {
  /** Section it realises. */
  readonly info: SectionInfo;
  /** Topology. */
  readonly topology: Topology;
  /** The target handed to the topology (gain signed). */
  readonly target: StageTarget;
  /** Why this topology. */
  readonly reason: string;
  /** Whether the topology was chosen automatically. */
  readonly automatic: boolean;
  /** Whether the stage took a bounded topology's largest gain below its wish (the remainder moved to later stages). */
  readonly bounded?: boolean;
}

/** Map a tf section to a stage kind and its reference gain. */
function describeSection(s: Section): { kind: StageKind; refGain: number; fz?: number } {
  const [b2, b1, b0] = s.num;
  if (s.order === 1) {
    const w0 = s.w0;
    if (s.kind === "lowpass") return { kind: "lowpass", refGain: b0 / w0 };
    if (s.kind === "highpass") return { kind: "highpass", refGain: b1 };
    if (s.kind === "allpass") return { kind: "allpass", refGain: b1 };
    throw new UnrealisableError({
      fn: "designFilter",
      path: "sections",
      message: "a first-order section with a general numerator has no topology; this is a bug in the section split",
    });
  }
  const w0 = s.w0;
  switch (s.kind) {
    case "lowpass":
      return { kind: "lowpass", refGain: b0 / (w0 * w0) };
    case "highpass":
      return { kind: "highpass", refGain: b2 };
    case "bandpass":
      return { kind: "bandpass", refGain: (b1 * s.q) / w0 };
    case "allpass":
      return { kind: "allpass", refGain: b2 };
    case "notch": {
      const wz = s.wz ?? Math.sqrt(Math.abs(b0 / b2));
      if (s.notchType === "lowpass-notch") return { kind: "lowpass-notch", refGain: b0 / (w0 * w0), fz: wz };
      if (s.notchType === "highpass-notch") return { kind: "highpass-notch", refGain: b2, fz: wz };
      return { kind: "notch", refGain: b2, fz: wz };
    }
    default:
      throw new UnrealisableError({
        fn: "designFilter",
        path: "sections",
        message: "a second-order section with a general numerator has no topology; this is a bug in the section split",
      });
  }
}

/** The dense grid (rad/s) used to find peaks of partial cascades. */
export function peakGrid(cascade: SectionCascade): Float64Array {
  const ws = cascade.sections.map((s) => s.w0);
  const lo = Math.min(...ws) / 100;
  const hi = Math.max(...ws) * 100;
  const n = Math.ceil(Math.log10(hi / lo) * 160) + 1;
  const g = logGrid(lo, hi, n);
  const all = [...g, ...ws].sort((a, b) => a - b);
  return Float64Array.from(all);
}

/**
 * Describe the sections of a cascade on a grid.
 *
 * @param cascade - target sections (rad/s)
 * @param grid - angular frequencies for peak finding
 * @returns one record per section
 */
export function describeSections(cascade: SectionCascade, grid: Float64Array): SectionInfo[] {
  return cascade.sections.map((section) => {
    const d = describeSection(section);
    const h = frequencyResponse({ sections: [section], gain: 1 / d.refGain }, grid);
    const unitMag = new Float64Array(grid.length);
    for (let i = 0; i < grid.length; i++) unitMag[i] = Math.hypot(h.re[i] as number, h.im[i] as number);
    return {
      section,
      kind: d.kind,
      order: section.order,
      f0Hz: section.w0 / TWO_PI,
      ...(section.order === 2 ? { q: section.q } : {}),
      ...(d.fz === undefined ? {} : { fzHz: d.fz / TWO_PI }),
      refGain: d.refGain,
      unitMag,
    };
  });
}

function maxOf(a: Float64Array): number {
  let m = 0;
  for (const x of a) if (x > m) m = x;
  return m;
}

type TopologyClass = "sk-unity" | "sk-equal" | "sk-gain" | "mfb" | "enhanced" | "multi" | "first" | "third" | "other";

function classify(t: Topology): TopologyClass {
  const id = t.id;
  if (t.order === 1) return "first";
  if (t.order === 3) return "third";
  if (t.opampCount >= 2) return "multi";
  if (id.includes("sallen-key")) {
    if (id.includes("unity")) return "sk-unity";
    if (id.includes("equal")) return "sk-equal";
    return "sk-gain";
  }
  if (id.includes("multiple-feedback") || id.includes("mfb")) return "mfb";
  if (id === "deliyannis-friend-bandpass") return "enhanced";
  return "other";
}

function baseTarget(info: SectionInfo, gain: number): StageTarget {
  return {
    order: info.order,
    kind: info.kind,
    f0Hz: info.f0Hz,
    ...(info.q === undefined ? {} : { q: info.q }),
    ...(info.fzHz === undefined ? {} : { fzHz: info.fzHz }),
    ...(info.realPoleHz === undefined ? {} : { realPoleHz: info.realPoleHz }),
    gain,
  };
}

/**
 * The gain magnitude a topology realises for a stage closest to the wish, or
 * null when it cannot realise the stage. With `bounded` (a stage before the
 * last), a topology that realises neither the wish nor unity gain but some
 * lower gain takes bounded-gain.ts `boundedGain`: the remainder moves to later stages.
 */
function realisableGain(t: Topology, info: SectionInfo, wish: number, bounded = false): number | null {
  const sign = t.inverting ? -1 : 1;
  const tries = [wish, 1];
  if (t.fixedGain !== undefined) {
    try {
      const { gain: _drop, ...rest } = baseTarget(info, 1);
      void _drop;
      tries.unshift(Math.abs(t.fixedGain(rest)));
    } catch {
      // no fixed gain for this target
    }
  }
  for (const g of tries) {
    if (!(g > 0) || !Number.isFinite(g)) continue;
    try {
      if (t.check(baseTarget(info, sign * g), {}) === null) return g;
    } catch {
      // not realisable with this gain
    }
  }
  if (!bounded || t.fixedGain !== undefined) return null;
  const g = boundedGain(t, (gain) => baseTarget(info, gain), wish);
  return g !== null && g >= BOUNDED_LEVEL_FLOOR * wish ? g : null;
}

/**
 * Whether the topology sets its gain with a capacitor ratio (e.g. the
 * multiple-feedback highpass, gain -C1/C3): such a gain can only take ratios
 * of stock capacitors, so a non-unity gain rounds coarsely.
 */
function gainSetByCapacitor(t: Topology, info: SectionInfo, got: number): boolean {
  const sign = t.inverting ? -1 : 1;
  const q = info.q ?? 0.5;
  // Hold the capacitor ratio fixed where the topology takes one (a ratio large
  // enough for any lowpass constraint), so only a gain-set capacitor moves.
  const held = 16 * (1 + 4 * q * q * (1 + 1.25 * got));
  for (const choices of [{ capacitor: 1e-8, capacitorRatio: held }, { capacitor: 1e-8 }]) {
    try {
      if (t.check(baseTarget(info, sign * got), choices) !== null) continue;
      if (t.check(baseTarget(info, sign * got * 1.25), choices) !== null) continue;
      const a = t.design(baseTarget(info, sign * got), choices);
      const b = t.design(baseTarget(info, sign * got * 1.25), choices);
      return Object.keys(a).some((k) => k.startsWith("C") && Math.abs((b[k] as number) / (a[k] as number) - 1) > 1e-9);
    } catch {
      // try the next probe
    }
  }
  return false;
}

/**
 * Capacitor spread (largest over smallest) of a single-op-amp second-order
 * stage designed with the topology's own default choices, or 1 where that
 * does not apply. A Sallen-Key or multiple-feedback lowpass needs a ratio
 * that grows as 4Q^2 (times 1 + |gain| for multiple feedback), which is what
 * pushes high-Q sections to multi-amplifier stages.
 */
function capacitorSpread(t: Topology, info: SectionInfo, got: number): number {
  if (t.order === 1 || t.opampCount !== 1) return 1;
  try {
    return capacitorSpreadOf(t.design(baseTarget(info, (t.inverting ? -1 : 1) * got), {}));
  } catch {
    return 1;
  }
}

/**
 * Largest capacitor over smallest among a stage's values (designators
 * starting with `C`); 1 when the stage has fewer than two capacitors.
 */
export function capacitorSpreadOf(values: Readonly<Record<string, number>>): number {
  const caps = Object.entries(values)
    .filter(([k]) => k.startsWith("C"))
    .map(([, v]) => v);
  return caps.length < 2 ? 1 : Math.max(...caps) / Math.min(...caps);
}

/**
 * Capacitor spread above which a single-op-amp stage starts to lose to a
 * multi-amplifier one (common practice, no source: beyond a decade of spread
 * the small capacitor nears board and op-amp input capacitance and the pair
 * rarely shares a dielectric or tolerance class).
 */
export const CAPACITOR_SPREAD_SOFT_LIMIT = 10;

/**
 * Largest gain (V/V) a stage other than the last is asked to carry when the
 * gain still to be placed exceeds twice this: the remainder is then spread
 * evenly over the later stages (no stage below this) instead of piling up in
 * the first (common practice, no
 * source: a single-op-amp stage's capacitor spread and its GBW demand grow
 * with its gain, the multiple-feedback lowpass's spread as 1 + |K|, so 40 dB
 * in one stage costs a large capacitor or a fast op-amp where two stages of
 * 20 dB need neither). No stage output then peaks above the filter's output
 * level; the early stages sit lower instead.
 */
export const STAGE_GAIN_CAP = 10;

/** Score points for a topology whose parts leave the resistor window at every impedance level tried (more than one op-amp). */
const OUTSIDE_WINDOW_PENALTY = 1.5;

/**
 * Whether the spec's resistor window is the user's (it differs from the
 * default the filter's frequency gives).
 *
 * @param spec - canonical spec
 * @returns true for a window the spec gives
 */
export function windowGiven(spec: DesignSpec): boolean {
  const d = defaultResistorWindow(characteristicFrequencyHz([...spec.passbandHz, ...spec.stopbandHz]));
  return Math.abs(d.min / spec.resistorRange.min - 1) > 1e-12 || Math.abs(d.max / spec.resistorRange.max - 1) > 1e-12;
}

function score(t: Topology, info: SectionInfo, wish: number, got: number, last: boolean): number {
  const q = info.q ?? 0.5;
  let s = t.opampCount;
  // Two score points per decade of capacitor spread beyond the soft limit.
  s += 2 * Math.max(0, Math.log10(capacitorSpread(t, info, got) / CAPACITOR_SPREAD_SOFT_LIMIT));
  if (Math.abs(got - 1) > 1e-9 && gainSetByCapacitor(t, info, got)) s += last ? 2 : 0.5;
  switch (classify(t)) {
    case "sk-unity":
      s += q > 1 ? 2 * (q - 1) : 0;
      break;
    case "sk-equal":
      s += 0.5 + (q > 1 ? 1.5 * (q - 1) : 0);
      break;
    case "sk-gain":
      s += 0.2 + (q > 1 ? 1.5 * (q - 1) : 0);
      break;
    case "mfb":
      s += 0.3 + (info.kind === "bandpass" ? (q > 10 ? 0.5 * (q - 10) : 0) : q > 5 ? 0.5 * (q - 5) : 0);
      break;
    case "enhanced":
      // positive-feedback Q enhancement: one op-amp, but its Q spreads about 17 times as far with the
      // parts as the multiple-feedback bandpass's (7 % against 0.4 % at Q 15 with 5 % capacitors,
      // measured by Monte Carlo, topologies/deliyannis-friend.ts), so it comes after both the
      // multiple-feedback and the multi-amplifier stages
      s += 1 + 0.15 * q;
      break;
    case "first":
      s += t.inverting ? 0.3 : 0;
      break;
    case "third":
      // as the second-order unity-gain stage: the pair's Q rides on positive feedback
      s += q > 1 ? 2 * (q - 1) : 0;
      break;
    default:
      s += 0.1;
  }
  s += 0.02 * t.componentNames.length;
  s += 2 * Math.abs(Math.log(got / wish));
  return s;
}

function describeReason(t: Topology, info: SectionInfo, automatic: boolean, got: number, wish: number): string {
  if (!automatic) return "named in the spec";
  const q = info.q === undefined ? "" : `Q ${info.q.toFixed(3)}, `;
  const g = Math.abs(got / wish - 1) > 1e-3 ? ` (gain fixed at ${got.toPrecision(4)} instead of ${wish.toPrecision(4)})` : "";
  const why: Record<TopologyClass, string> = {
    "sk-unity": "low Q at unity gain: fewest parts and one op-amp",
    "sk-equal": "equal-component stage: equal parts, gain set by Q",
    "sk-gain": "low Q with gain above unity: non-inverting, one op-amp",
    mfb: "moderate Q or gain below unity: one op-amp, low sensitivity to the op-amp",
    enhanced: "higher-Q bandpass with one op-amp, Q enhanced by positive feedback (more sensitive to the parts than the multi-amplifier stages)",
    multi: "high Q or finite zeros: a multi-amplifier stage with independent f0 and Q and no large capacitor spread",
    first: "first-order section",
    third: "a real pole and a low-Q pole pair in one stage: one op-amp where a first-order and a second-order stage take two",
    other: "best-scoring realisable topology",
  };
  return `${q}${info.kind}: ${why[classify(t)]}${g}`;
}

/** Options of {@link planStages}. */
export interface PlanOptions {
  /** Per-stage forced topology id (`"auto"` where free). */
  readonly forced: readonly string[];
  /** Topology ids automatic choices leave out, where another topology can build the stage. */
  readonly avoid?: ReadonlySet<string>;
  /**
   * Where a one-op-amp topology with a bounded gain may take less than its
   * stage's wish (see {@link GainBounds}).
   * @defaultValue "any"
   */
  readonly gainBounds?: GainBounds;
}

/**
 * Where stages may take a bounded topology's largest gain below their wish:
 * `"any"` a stage before the last (the remainder moves on, see
 * bounded-gain.ts `BOUNDED_GAIN_FRACTION`) and the last (the stages before it lifted,
 * see `liftedForLastStage`); `"last"` the last only; `"none"` no stage (every
 * stage at the equal-peak gain).
 */
export type GainBounds = "any" | "last" | "none";

interface Assignment {
  readonly plans: StagePlan[];
  readonly score: number;
  readonly negatives: number;
}

/**
 * The best-scoring topology of the pool for one stage, with the gain it
 * takes; with `needFit`, only topologies whose parts fit the hard limits at
 * some impedance level ({@link levelFit}).
 */
function pickTopology(
  spec: DesignSpec,
  pool: readonly Topology[],
  info: SectionInfo,
  wish: number,
  last: boolean,
  needFit: boolean,
  boundedGains: boolean,
): { t: Topology; got: number; s: number } | null {
  let best: { t: Topology; got: number; s: number } | null = null;
  for (const t of pool) {
    if (!t.kinds.includes(info.kind) || t.order !== info.order) continue;
    const got = realisableGain(t, info, wish, boundedGains && !last);
    if (got === null) continue;
    const fit = needFit ? levelFit(t, baseTarget(info, (t.inverting ? -1 : 1) * got), spec) : "none";
    if (needFit && fit === "none") continue;
    // A window the spec gives is kept: a topology whose parts fit only the wider limits waits for the second pass.
    if (needFit && fit === "within-limits" && windowGiven(spec)) continue;
    // The last stage must carry the remaining gain exactly when it can.
    let s = score(t, info, wish, got, last) + (last ? 4 * Math.abs(Math.log(got / wish)) : 0);
    // A stage that leaves the resistor window at every level costs more than an extra op-amp.
    if (fit === "within-limits") s += OUTSIDE_WINDOW_PENALTY;
    // With a real op-amp, prefer stages whose GBW demand it meets.
    if (spec.opamp.kind !== "ideal") {
      try {
        const demand = t.gbwDemandHz(baseTarget(info, (t.inverting ? -1 : 1) * got));
        if (demand > spec.opamp.gbwHz) s += 1 + 2 * Math.log10(demand / spec.opamp.gbwHz);
      } catch {
        // no demand figure for this target
      }
    }
    if (best === null || s < best.s) best = { t, got, s };
  }
  return best;
}

/**
 * Assign topologies and gains. `lift` (at least 1) raises the level every
 * stage before the last is asked for above the filter's output level, so the
 * last stage is left `1 / lift` of its equal-peak gain (see {@link planStages}).
 */
function assign(spec: DesignSpec, infos: readonly SectionInfo[], forced: readonly string[], avoid?: ReadonlySet<string>, boundedGains = true, lift = 1): Assignment | string {
  const n = infos.length;
  // Peaks of the unit partial cascades.
  const partial = new Float64Array((infos[0] as SectionInfo).unitMag.length).fill(1);
  const peaks: number[] = [];
  for (const info of infos) {
    for (let i = 0; i < partial.length; i++) partial[i] = (partial[i] as number) * (info.unitMag[i] as number);
    peaks.push(maxOf(partial));
  }
  const total = spec.gain / (peaks[n - 1] as number);
  const plans: StagePlan[] = [];
  let product = 1;
  let sum = 0;
  let negatives = 0;
  for (let i = 0; i < n; i++) {
    const info = infos[i] as SectionInfo;
    const last = i === n - 1;
    const remaining = total / product;
    const share = remaining > 2 * STAGE_GAIN_CAP ? Math.max(STAGE_GAIN_CAP, remaining ** (1 / (n - i))) : Infinity;
    const wish = last ? remaining : Math.min((lift * spec.gain) / (peaks[i] as number) / product, share);
    const choice = forced[i] ?? "auto";
    let pool = choice === "auto" ? topologiesFor({ kind: info.kind, order: info.order }) : [getTopology(choice)];
    if (choice === "auto" && avoid !== undefined && avoid.size > 0) {
      const kept = pool.filter((t) => !avoid.has(t.id));
      if (kept.some((t) => realisableGain(t, info, 1) !== null)) pool = kept;
    }
    // First only the topologies whose parts fit the hard limits at some impedance level; when none does, all of them.
    const best = pickTopology(spec, pool, info, wish, last, true, boundedGains) ?? pickTopology(spec, pool, info, wish, last, false, boundedGains);
    if (best === null) {
      return choice === "auto"
        ? `no topology in the registry realises a ${info.order === 3 ? "third" : info.order === 2 ? "second" : "first"}-order ${info.kind} stage (f0 ${info.f0Hz.toPrecision(4)} Hz${info.q === undefined ? "" : `, Q ${info.q.toPrecision(4)}`})`
        : `topology "${choice}" cannot realise stage ${i + 1}, a ${info.kind} section (f0 ${info.f0Hz.toPrecision(4)} Hz${info.q === undefined ? "" : `, Q ${info.q.toPrecision(4)}`})`;
    }
    const sign = best.t.inverting ? -1 : 1;
    if (best.t.inverting) negatives++;
    product *= best.got;
    sum += best.s;
    plans.push({
      info,
      topology: best.t,
      target: baseTarget(info, sign * best.got),
      reason: describeReason(best.t, info, choice === "auto", best.got, wish),
      automatic: choice === "auto",
      ...(realisableGain(best.t, info, wish) === null || (last && lift > 1) ? { bounded: true } : {}),
    });
  }
  return { plans, score: sum, negatives };
}

/**
 * Where the last stage takes a multi-amplifier topology but a one-op-amp one
 * realises at least `BOUNDED_LEVEL_FLOOR` of its gain (its
 * `boundedGain`, bounded-gain.ts), the assignment with the stages before it lifted by
 * the difference (their outputs then peak at most 1/0.85, 1.4 dB, above the
 * filter's output level instead of at it), when that needs fewer op-amps.
 */
function liftedForLastStage(spec: DesignSpec, infos: readonly SectionInfo[], options: PlanOptions, first: Assignment, bounded: boolean): Assignment {
  const n = infos.length;
  const lastPlan = first.plans[n - 1] as StagePlan;
  if (n < 2 || !lastPlan.automatic || lastPlan.topology.opampCount < 2) return first;
  const info = infos[n - 1] as SectionInfo;
  const remaining = Math.abs(lastPlan.target.gain);
  const opamps = (a: Assignment): number => a.plans.reduce((k, p) => k + p.topology.opampCount, 0);
  let best = first;
  for (const t of topologiesFor({ kind: info.kind, order: info.order })) {
    if (t.opampCount !== 1 || t.fixedGain !== undefined || options.avoid?.has(t.id) === true) continue;
    if (realisableGain(t, info, remaining) !== null) continue;
    const g = boundedGain(t, (gain) => baseTarget(info, gain), remaining);
    if (g === null || g < BOUNDED_LEVEL_FLOOR * remaining) continue;
    const a = assign(spec, infos, options.forced, options.avoid, bounded, remaining / g);
    if (typeof a !== "string" && opamps(a) < opamps(best)) best = a;
  }
  return best;
}

/**
 * Choose a topology and a gain for every section.
 *
 * @param spec - canonical spec (gain, polarity)
 * @param infos - sections in cascade order
 * @param options - forced topologies
 * @returns the plans and whether the polarity requirement could be met
 * @throws {@link SpecError} when a named topology cannot realise its stage
 * @throws {@link UnrealisableError} when no topology realises a stage
 */
export function planStages(
  spec: DesignSpec,
  infos: readonly SectionInfo[],
  options: PlanOptions,
): { readonly plans: readonly StagePlan[]; readonly polarityOk: boolean } {
  const bounds = options.gainBounds ?? "any";
  const bounded = bounds === "any";
  let first = assign(spec, infos, options.forced, options.avoid, bounded);
  if (typeof first === "string") {
    const forcedAny = options.forced.some((f) => f !== "auto");
    if (forcedAny) throw new SpecError("designFilter", [{ path: "topology", message: first }]);
    throw new UnrealisableError({ fn: "designFilter", path: "topology", message: first });
  }
  if (bounds !== "none") first = liftedForLastStage(spec, infos, options, first, bounded);
  const wantNegative = spec.polarity === "inverting";
  const ok = (a: Assignment): boolean =>
    spec.polarity === "either" || (a.negatives % 2 === 1) === wantNegative;
  if (ok(first)) return { plans: first.plans, polarityOk: true };
  // Flip one automatically chosen stage to a topology of the other polarity.
  let best: Assignment | null = null;
  for (let i = 0; i < infos.length; i++) {
    if ((options.forced[i] ?? "auto") !== "auto") continue;
    const info = infos[i] as SectionInfo;
    const current = (first.plans[i] as StagePlan).topology;
    for (const t of topologiesFor({ kind: info.kind, order: info.order })) {
      if (t.inverting === current.inverting) continue;
      const forced = infos.map((_, j) => (j === i ? t.id : (options.forced[j] ?? "auto")));
      const a = assign(spec, infos, forced, options.avoid, bounded);
      if (typeof a === "string" || !ok(a)) continue;
      // Keep the flipped stage marked as automatic.
      const plans = a.plans.map((p, j) => (j === i ? { ...p, automatic: true, reason: `${describeReason(p.topology, p.info, true, Math.abs(p.target.gain), Math.abs(p.target.gain))}; chosen for the requested polarity` } : p));
      const cand = { ...a, plans };
      if (best === null || cand.score < best.score) best = cand;
    }
  }
  if (best !== null) return { plans: best.plans, polarityOk: true };
  return { plans: first.plans, polarityOk: false };
}
