/**
 * The op-amp level plot: at every op-amp output of the design (the
 * internal nodes of multi-amplifier stages included) the gain from the filter
 * input over frequency, or, when the spec gives signal levels, the peak
 * output voltage at the largest input against the output swing. This is
 * where a design clips first: an internal node of a state-variable or
 * Tow-Thomas stage can peak well above the filter's own output.
 *
 * Method: each stage's elements with the design's op-amp model solved by
 * nodal analysis (src/circuit/mna.ts) for every op-amp output, the stages
 * before it multiplied in (they are buffered by their op-amp outputs), on the
 * adaptive grid of src/report/plot/adaptive.ts with every peak searched; the
 * found peaks of the design (`stages[].opampPeaks`, src/design/headroom.ts)
 * are marked and agree with the curves' maxima.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { builtStages } from "../../design/response.ts";
import { acAnalysis } from "../../circuit/mna.ts";
import { INTERNAL_NODE_PREFIX, stageElements } from "../../evaluate/stage-polynomials.ts";
import { adaptiveSample, type CurveEvaluator } from "./adaptive.ts";
import { drawing, line } from "./draw.ts";
import type { LegendEntry } from "./legend.ts";
import { FORBIDDEN, traceStyle } from "./palette.ts";
import { finiteRange } from "./phase.ts";
import { PIXEL_TOLERANCE } from "./response-curves.ts";
import { px } from "./text.ts";
import type { PlotSettings } from "./settings.ts";

/** One op-amp output of the design. */
interface Tap {
  readonly opamp: string;
  readonly stage: number;
  readonly node: string;
}

/** The gains in dB from the filter input to every op-amp output, stage by stage. */
function tapEvaluator(result: DesignResult): { taps: Tap[]; evaluate: CurveEvaluator } {
  const stages = builtStages(result);
  const opamp = result.spec.opamp;
  const circuits = stages.map((s) => {
    const elements = stageElements(s.topology, s.values, opamp);
    return { elements, nodes: elements.flatMap((e) => (e.kind === "OA" ? [e.out] : [])) };
  });
  const taps: Tap[] = [];
  circuits.forEach((c, k) => {
    const st = result.stages[k] as DesignResult["stages"][number];
    c.nodes.forEach((node, j) => taps.push({ opamp: st.opamps[j] ?? `U${taps.length + 1}`, stage: k + 1, node: node === "out" ? "out" : node.slice(INTERNAL_NODE_PREFIX.length) }));
  });
  const evaluate: CurveEvaluator = (f) => {
    const re = new Float64Array(f.length).fill(1);
    const im = new Float64Array(f.length);
    const out: Float64Array[] = [];
    circuits.forEach((c, k) => {
      const h = acAnalysis({ title: `stage ${k + 1}`, elements: c.elements }, { source: "Vin", outputs: c.nodes, freqHz: f }).outputs;
      for (const node of c.nodes) {
        const t = h[node] as { re: Float64Array; im: Float64Array };
        out.push(Float64Array.from(f, (_, i) => 20 * Math.log10(Math.hypot((re[i] as number) * (t.re[i] as number) - (im[i] as number) * (t.im[i] as number), (re[i] as number) * (t.im[i] as number) + (im[i] as number) * (t.re[i] as number)))));
      }
      const o = h["out"] as { re: Float64Array; im: Float64Array };
      for (let i = 0; i < f.length; i++) {
        const a = re[i] as number;
        const b = im[i] as number;
        re[i] = a * (o.re[i] as number) - b * (o.im[i] as number);
        im[i] = a * (o.im[i] as number) + b * (o.re[i] as number);
      }
    });
    return out;
  };
  return { taps, evaluate };
}

/** A tap's name in the legend. */
const tapLabel = (t: Tap): string => `${t.opamp}: stage ${t.stage} ${t.node === "out" ? "output" : `node ${t.node}`}`;

/**
 * Draw the op-amp level plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, span
 * @returns SVG text
 */
export function opampLevelsPlot(result: DesignResult, o: PlotSettings): string {
  const { taps, evaluate } = tapEvaluator(result);
  const levels = result.spec.levels ?? undefined;
  const heightPx = Math.max(100, o.height - 160);
  const range: [number, number] = [result.verification.gainDb - result.spec.minAttenuationDb - 30, result.verification.gainDb + 20];
  const s = adaptiveSample(evaluate, {
    startHz: o.startHz,
    stopHz: o.stopHz,
    initialPoints: 200,
    maxPoints: 4000,
    tolerance: taps.map(() => (PIXEL_TOLERANCE * (range[1] - range[0])) / heightPx),
    clamp: taps.map(() => range),
    polish: taps.map(() => true),
  });
  const toY = (db: number): number => (levels === undefined ? db : levels.inputPeakV * 10 ** (db / 20));
  const ys = s.curves.map((c) => c.map(toY));
  let [lo, hi] = finiteRange(Float64Array.from(ys.flatMap((y) => Array.from(y))));
  if (levels === undefined) lo = Math.max(lo, hi - 80);
  else {
    lo = 0;
    hi = Math.max(hi, levels.outputSwingV) * 1.05;
  }
  const legend: LegendEntry[] = taps.map((t, i) => ({ label: tapLabel(t), stroke: traceStyle(i).stroke, dash: traceStyle(i).dash, strokeWidth: 1.6 }));
  if (levels !== undefined) legend.push({ label: `output swing ${levels.outputSwingV} V peak`, stroke: FORBIDDEN, dash: "6 3", strokeWidth: 1.4 });
  const spec = result.spec;
  const title =
    o.title ??
    (levels === undefined
      ? `${result.family} ${spec.response}, ${result.filterOrder} poles: gain from the input to every op-amp output`
      : `${result.family} ${spec.response}, ${result.filterOrder} poles: op-amp output amplitude at ${levels.inputPeakV} V peak in`);
  const peaks = result.stages.flatMap((st) => st.opampPeaks).filter((p) => p.hz >= o.startHz && p.hz <= o.stopHz);
  if (peaks.length > 0) legend.push({ label: "peak found by the design's search", stroke: "#000000", marker: "ring" });
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "log", min: o.startHz, max: o.stopHz, title: "Frequency", unit: "Hz", exact: true },
      y: levels === undefined ? { scale: "linear", min: lo, max: hi + 3, title: "Gain to the op-amp output", unit: "dB" } : { scale: "linear", min: lo, max: hi, title: "Output amplitude", unit: "V", prefixed: true },
      legend,
      idSeed: `opamp-levels|${s.freqHz.length}|${taps.length}|${ys[0]?.[0]}`,
    },
    title,
    (f) => [
      ...(levels === undefined ? [] : [line(f, [o.startHz, o.stopHz], [levels.outputSwingV, levels.outputSwingV], { stroke: FORBIDDEN, width: 1.4, dash: "6 3" })]),
      ...ys.map((y, i) => line(f, s.freqHz, y, { stroke: traceStyle(i).stroke, width: 1.6, dash: traceStyle(i).dash })),
      ...peaks.map((p) => `<circle cx="${px(f.X(p.hz))}" cy="${px(f.Y(toY(20 * Math.log10(p.gain))))}" r="4" fill="none" stroke="#000000" stroke-width="1.2"/>`),
    ],
  );
}
