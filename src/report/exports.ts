/**
 * Two plain exports of a finished design for the engineer's other tools:
 * the as-built response as a CSV table of curves, and the as-built transfer
 * function as a table of second-order sections in the row layout of
 * scipy.signal's analog `sos` (`zpk2sos(z, p, k, analog=True)`, scipy 1.8 and
 * later): each row `[b0, b1, b2, a0, a1, a2]` is the section
 * (b0 s^2 + b1 s + b2) / (a0 s^2 + a1 s + a2), s in rad/s.
 *
 * The sections are each stage's as-built transfer function with ideal
 * op-amps, from its preferred part values (the topology's closed form), not
 * the target sections; the product of all rows is the board's transfer
 * function with ideal op-amps. A stage of degree above two (the twin-T notch
 * has a real third pole) is factored by its roots (Aberth iteration,
 * src/math/roots.ts) and paired by src/tf/sections.ts, so it gives more rows;
 * relative accuracy of the coefficients about 1e-13 for a stage of degree two,
 * about 1e-10 where roots are taken.
 *
 * @module
 */
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";
import { builtStages } from "../design/response.ts";
import { responseCurve, responseSpanHz } from "../design/verify.ts";
import { stagePolynomials } from "../evaluate/stage-polynomials.ts";
import { polyRoots } from "../math/roots.ts";
import { toSectionsUnchecked } from "../tf/sections.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { checkOpAmpModel } from "../circuit/validate.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requireInteger, requireOptions, requirePositive } from "../validate.ts";

/** One row of the section table. */
export interface SectionRow {
  /** The stage the section belongs to, from 1. */
  readonly stage: number;
  /** Numerator `[b0, b1, b2]`: b0 s^2 + b1 s + b2 (s in rad/s). */
  readonly num: readonly [number, number, number];
  /** Denominator `[a0, a1, a2]`: a0 s^2 + a1 s + a2, normalised so that its leading coefficient is 1. */
  readonly den: readonly [number, number, number];
}

const IDEAL: OpAmpModel = Object.freeze({ kind: "ideal" });

/** Coefficients of a scaled rational (z = s / scale) as polynomials in s, descending powers. */
function inS(c: Float64Array, scale: number): number[] {
  const n = c.length - 1;
  return Array.from(c, (x, i) => x / scale ** (n - i));
}

/** Drop leading zeros (exactly zero coefficients, as the closed forms give them). */
function trim(c: number[]): number[] {
  let i = 0;
  while (i < c.length - 1 && c[i] === 0) i++;
  return c.slice(i);
}

const pad3 = (c: readonly number[]): [number, number, number] => {
  const p = [0, 0, 0, ...c].slice(-3);
  return [p[0] as number, p[1] as number, p[2] as number];
};

/** The rows of one stage's rational function in s. */
function rowsOf(stage: number, num: number[], den: number[]): SectionRow[] {
  if (num.length <= 3 && den.length <= 3) {
    const lead = den[0] as number;
    return [{ stage, num: pad3(num.map((x) => x / lead)), den: pad3(den.map((x) => x / lead)) }];
  }
  const zeros = num.length > 1 ? polyRoots(num) : [];
  const poles = polyRoots(den);
  const cascade = toSectionsUnchecked({ zeros, poles, gain: (num[0] as number) / (den[0] as number) }, "as-given");
  return cascade.sections.map((s, i) => {
    const k = i === 0 ? cascade.gain : 1;
    const lead = s.order === 1 ? s.den[1] : s.den[0];
    return { stage, num: pad3(s.num.map((x) => (x * k) / lead)), den: pad3(s.den.map((x) => x / lead)) };
  });
}

/**
 * The as-built transfer function of a design as second-order sections, one
 * row per section in scipy's analog `sos` layout (see the module header).
 *
 * @param result - a design from `designFilter`
 * @returns the rows, stage by stage in cascade order
 * @throws {@link InvalidArgumentError} when `result` is not a design result
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const rows = sectionRows(designFilter(spec));
 * rows.every((r) => r.den[0] === 1 || (r.den[0] === 0 && r.den[1] === 1)); //=> true
 * ```
 */
export function sectionRows(result: DesignResult): SectionRow[] {
  requireDesignResult("sectionRows", result);
  return builtStages(result).flatMap((s, k) => {
    const p = stagePolynomials(s.topology, s.values, IDEAL, { closedForm: true });
    if (p === null) throw new InvalidArgumentError({ fn: "sectionRows", path: `result.stages[${k}]`, message: "the stage's equations are singular with these parts; the design record is damaged" });
    return rowsOf(k + 1, trim(inS(p.num, p.scale)), trim(inS(p.den, p.scale)));
  });
}

/**
 * The section table as CSV: a header `stage,b0,b1,b2,a0,a1,a2` and one row per
 * section (every digit, so `numpy.loadtxt(..., delimiter=",", skiprows=1)[:, 1:]`
 * is an analog `sos` array for scipy).
 *
 * @param result - a design from `designFilter`
 * @returns the CSV text (lines end in `\n`)
 * @throws {@link InvalidArgumentError} when `result` is not a design result
 * @example
 * ```ts
 * toSectionsCsv(designFilter(spec)).split("\n")[0]; //=> "stage,b0,b1,b2,a0,a1,a2"
 * ```
 */
export function toSectionsCsv(result: DesignResult): string {
  const rows = sectionRows(result);
  return ["stage,b0,b1,b2,a0,a1,a2", ...rows.map((r) => [r.stage, ...r.num, ...r.den].map(String).join(","))].join("\n") + "\n";
}

/**
 * The section table as JSON: `{ "layout": "scipy analog sos", "columns": [...],
 * "sections": [{ "stage", "sos": [b0, b1, b2, a0, a1, a2] }, ...] }`, every
 * digit kept, so `numpy.array([s["sos"] for s in data["sections"]])` is an
 * analog `sos` array for scipy.
 *
 * @param result - a design from `designFilter`
 * @returns the JSON text (ends in a newline)
 * @throws {@link InvalidArgumentError} when `result` is not a design result
 * @example
 * ```ts
 * JSON.parse(toSectionsJson(designFilter(spec))).columns; //=> ["b0", "b1", "b2", "a0", "a1", "a2"]
 * ```
 */
export function toSectionsJson(result: DesignResult): string {
  const rows = sectionRows(result);
  const data = { layout: "scipy analog sos", columns: ["b0", "b1", "b2", "a0", "a1", "a2"], sections: rows.map((r) => ({ stage: r.stage, sos: [...r.num, ...r.den] })) };
  return `${JSON.stringify(data, null, 1)}\n`;
}

/** Options of {@link toCurveCsv}. */
export interface CurveCsvOptions {
  /**
   * Points, log-spaced (2 to 100000).
   * @defaultValue 1000
   */
  readonly points?: number;
  /**
   * First frequency, Hz.
   * @defaultValue a decade below the lowest edge of the spec
   */
  readonly startHz?: number;
  /**
   * Last frequency, Hz (above `startHz`).
   * @defaultValue a decade above the highest edge of the spec
   */
  readonly stopHz?: number;
  /**
   * Op-amp model of the curves.
   * @defaultValue the design's op-amp
   */
  readonly opamp?: OpAmpModel;
}

/**
 * The as-built response as CSV: `frequency_hz,magnitude_db,phase_deg,group_delay_s`
 * on log-spaced points, with the design's op-amp (phase unwrapped; group delay
 * by a central difference of the phase over +-1e-6 relative frequency).
 *
 * @param result - a design from `designFilter`
 * @param options - points, span and op-amp model
 * @returns the CSV text (lines end in `\n`)
 * @throws {@link InvalidArgumentError} naming the option that is out of range
 * @example
 * ```ts
 * toCurveCsv(designFilter(spec), { points: 3 }).split("\n").length; //=> 5 (header, 3 rows, final newline)
 * ```
 */
export function toCurveCsv(result: DesignResult, options: CurveCsvOptions = {}): string {
  const fn = "toCurveCsv";
  requireDesignResult(fn, result);
  const o = requireOptions(fn, "options", options);
  const points = o["points"] === undefined ? 1000 : requireInteger(fn, "options.points", o["points"], { min: 2, max: 100000 });
  const [lo, hi] = responseSpanHz(result.spec);
  const start = o["startHz"] === undefined ? lo : requirePositive(fn, "options.startHz", o["startHz"]);
  const stop = o["stopHz"] === undefined ? hi : requirePositive(fn, "options.stopHz", o["stopHz"]);
  if (!(stop > start)) throw new InvalidArgumentError({ fn, path: "options.stopHz", received: stop, message: `expected a frequency above startHz (${start} Hz)` });
  if (stop > 1e12) throw new InvalidArgumentError({ fn, path: "options.stopHz", received: stop, message: "expected at most 1 THz" });
  if (o["opamp"] !== undefined) checkOpAmpModel(fn, "options.opamp", o["opamp"]);
  const opamp = (o["opamp"] as OpAmpModel | undefined) ?? result.spec.opamp;
  const c = responseCurve(result.spec, builtStages(result), opamp, points, [start, stop]);
  const lines = ["frequency_hz,magnitude_db,phase_deg,group_delay_s"];
  for (let i = 0; i < points; i++) lines.push(`${c.freqHz[i]},${c.magnitudeDb[i]},${c.phaseDeg[i]},${c.groupDelayS[i]}`);
  return lines.join("\n") + "\n";
}
