/**
 * The one-line verdict of a design, as the command line, the Markdown
 * report and the netlist header print it: the nominal board against the
 * mask, then the boards built from toleranced parts against the yield
 * target.
 *
 * @module
 */
import type { DesignResult } from "./types.ts";

const pc = (x: number): string => `${Number((x * 100).toPrecision(3))}`;

/** Tolerances as text: "1 %" or "0.5-1 %". */
function tolerances(xs: readonly number[]): string {
  if (xs.length === 0) return "-";
  const lo = xs[0] as number;
  const hi = xs[xs.length - 1] as number;
  return lo === hi ? `${pc(lo)} %` : `${pc(lo)}-${pc(hi)} %`;
}

/**
 * The verdict line: "meets the mask nominally, margin 0.21 dB; 97.4 % of
 * boards [96.2, 98.3] at 1 % R / 2 % C (target 95 %: met)".
 *
 * @param r - a design
 * @returns the line
 */
export function verdictLine(r: DesignResult): string {
  const v = r.verification;
  const y = v.yield;
  const margin = `margin ${v.marginDb.toFixed(3)} dB`;
  const nominal = v.meetsSpec
    ? `meets the mask nominally, ${margin}`
    : !v.stable
      ? `is unstable (stage ${v.unstableStages.join(", ")} oscillates with the op-amp)`
      : v.marginDb < 0 || !v.polarityOk
        ? `misses the mask nominally, ${margin}`
        : v.headroom?.clips === true
          ? `meets the mask nominally (${margin}) but op-amp ${v.headroom.worstOpamp} clips at the spec's signal levels`
          : `misses the spec nominally, ${margin}`;
  const boards = `${pc(y.fraction)} % of boards [${pc(y.lower95)}, ${pc(y.upper95)}] at ${tolerances(y.resistorTolerances)} R / ${tolerances(y.capacitorTolerances)} C`;
  const unstable = y.unstableBoards > 0 ? `, ${y.unstableBoards} of ${y.boards} boards unstable` : "";
  return `${nominal}; ${boards} (${y.boards} boards${unstable}; target ${pc(y.target)} %: ${y.met ? "met" : "NOT met"})`;
}
